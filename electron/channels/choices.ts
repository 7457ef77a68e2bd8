/**
 * What the evaluate channels may ask beyond the plan (a Monte Carlo run, a best package within
 * a budget) and the proposal's options channel. The limits keep one request to about a second
 * of work: the page runs its own larger runs in its worker.
 */
import { z } from 'zod';
import {
  proposalOptionsReport,
  type ChoicesRequest,
  type OptionReport,
} from '../../core/choices.ts';
import { PACKAGE_OBJECTIVES } from '../../core/plan/best-package.ts';
import { DISTRIBUTIONS } from '../../core/uncertainty/distributions.ts';
import { channel, id, recordOf } from './_define.ts';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';

/** The most draws a channel request runs. */
export const MAX_CHANNEL_DRAWS = 200_000;

const dollars = z.number().min(0).max(1e9);

/** The optional fields of a Monte Carlo run. */
export const rangesFields = {
  draws: z.int().min(1).max(MAX_CHANNEL_DRAWS).optional(),
  seed: z
    .int()
    .min(0)
    .max(2 ** 32 - 1)
    .optional(),
  distribution: z.enum(DISTRIBUTIONS).optional(),
  vary: z
    .strictObject({
      escalation: z.boolean().optional(),
      efficiency: z.boolean().optional(),
      nFactor: z.boolean().optional(),
    })
    .optional(),
};

/** The optional fields of the evaluate channels. */
export const choicesFields = {
  ...rangesFields,
  budget: z
    .strictObject({
      /** Null: no limit. */
      budgetUsd: dollars.nullable(),
      objective: z.enum(PACKAGE_OBJECTIVES).optional(),
      everyMeasureSirAtLeastOne: z.boolean().optional(),
      packageSirAtLeastOne: z.boolean().optional(),
    })
    .optional(),
};

/** The choices part of a parsed evaluate request. */
export function choicesOf(request: ChoicesRequest): ChoicesRequest {
  const { draws, seed, distribution, vary, budget } = request;
  return { draws, seed, distribution, vary, budget };
}

/** The `plan.options` channel. */
export const choiceChannels = {
  'plan.options': channel({
    request: z.strictObject({
      homeId: id,
      firstStepBudgetUsd: dollars.optional(),
      firstStepShare: z.number().min(0).max(1).optional(),
      thoroughBudgetUsd: dollars.optional(),
      ...rangesFields,
    }),
    response: z.array(recordOf<OptionReport>()),
    handle: ({ store }, { homeId, ...request }) =>
      store.read((read) =>
        proposalOptionsReport(evaluateStoredHome(read, homeId).evaluation, request),
      ),
  }),
};
