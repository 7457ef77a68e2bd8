/**
 * (e) of core/plan/best-package/bounds-aim2.ts held to the model: for states s drawn in a
 * home's box at test-in and s′ = s − a·e_l (a within the room), a year's heating and
 * electricity dollars from `model.energyOf` (natural flow, the 62.2 fan and its power; hour by
 * hour the latent load too) fall by at most a·slope of `stepSlopes`. Shared by the
 * degree-day and the hourly AIM-2 tests.
 */
import { expect } from 'vitest';
import type { Evaluation } from '../../core/evaluate.ts';
import { totalCfm50, type LeakageByLocation } from '../../core/home-model.ts';
import {
  buildAim2Bound,
  stepSlopes,
  subtreeBox,
} from '../../core/plan/best-package/bounds-aim2.ts';
import type { LiveMeasure } from '../../core/plan/best-package/remaining-measures.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { LEAK_LOCATIONS } from '../../core/schema.ts';
import { stateIn } from './aim2-states.ts';
import { measuresInPlanOrder } from './package-brute-force.ts';

/**
 * Draws `samples` states in the home's box and steps from each at every location, expecting
 * each step's fall in dollars within its slope bound.
 *
 * @returns how many steps were checked, and how many had slopes saying they cost more than
 *   they save (heating plus electricity below 0)
 */
export function checkStepDollars(
  evaluation: Evaluation,
  next: () => number,
  samples = 8,
): { checked: number; negative: number } {
  const { model } = evaluation;
  const prices = buildPriceBook(evaluation.home);
  const bound = buildAim2Bound(model, prices);
  const dollars = (leakage: LeakageByLocation) => {
    const energy = model.energyOf(leakage);
    return {
      heating: energy.heatingFuelUnits * prices.heating.usdPerUnitFloat,
      electricity:
        (energy.coolingKwh + energy.ventilationFanKwh) * (prices.electricity?.usdPerUnitFloat ?? 0),
    };
  };
  const upper = model.testIn;
  const live: LiveMeasure[] = measuresInPlanOrder(evaluation).energy.map((measure, index) => ({
    index,
    location: measure.location,
    sizeCfm50: Math.min(Math.max(0, measure.estimateCfm50.likely), upper[measure.location]),
    costUsd: measure.cost.totalUsdFloat,
    factors: { heating: 1, electricity: 1 },
  }));
  const box = subtreeBox(bound, upper, live);
  if (box === null) return { checked: 0, negative: 0 };
  const lower = { ...upper };
  for (const measure of live) lower[measure.location] -= measure.sizeCfm50;
  for (const location of LEAK_LOCATIONS) lower[location] = Math.max(0, lower[location]);
  const bottom = Math.max(model.floorCfm50, totalCfm50(lower));
  const slopes = stepSlopes(bound, box, model.testInCfm50, bottom);
  let checked = 0;
  let negative = 0;
  for (let sample = 0; sample < samples; sample += 1) {
    const state = stateIn(lower, upper, next);
    if (totalCfm50(state) < bottom) continue;
    const before = dollars(state);
    for (const location of LEAK_LOCATIONS) {
      const room = Math.min(state[location] - lower[location], totalCfm50(state) - bottom);
      if (room <= 0) continue;
      const step = room * next();
      const after = dollars({ ...state, [location]: state[location] - step });
      const tolerance = 1e-9 * (1 + before.heating + before.electricity);
      expect(before.heating - after.heating).toBeLessThanOrEqual(
        step * slopes.heating[location] + tolerance,
      );
      expect(before.electricity - after.electricity).toBeLessThanOrEqual(
        step * slopes.electricity[location] + tolerance,
      );
      if (slopes.heating[location] + slopes.electricity[location] < 0) negative += 1;
      checked += 1;
    }
  }
  return { checked, negative };
}
