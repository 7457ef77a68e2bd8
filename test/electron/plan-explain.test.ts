/**
 * The plan.explain channel on a real project file (SQLite in a temporary folder, the demo
 * homes seeded as on first start): for each stored home and measure it gives the trace the
 * core works from the home's exported file, its results are the figures plan.evaluate
 * reports for the same measure, it respects the project's library edits, reads without
 * writing, and refuses unknown measures and homes naming the field.
 *
 * What it is checked against: the core's own explainMeasure and evaluateHome on the store's
 * exported home file (db/home-file.ts), and the channel's own plan.evaluate reply.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { explainMeasure, type MeasureTrace } from '../../core/plan/trace.ts';
import type { MeasureReport } from '../../core/report.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import { effectiveLibrary } from '../../db/repositories/library.ts';
import {
  callChannel,
  type ChannelName,
  type ChannelRequest,
  type ChannelResponse,
} from '../../electron/channels.ts';
import {
  addKnownRows,
  openChannelProject,
  valueOf,
  type ChannelProject,
} from './_lib/channel-project.ts';
import { refusalProblems } from './_lib/reply-checks.ts';
import { projectDigest } from './_lib/table-digest.ts';

let project: ChannelProject;

beforeAll(() => {
  project = openChannelProject('sealwork-plan-explain-');
});

afterAll(() => project.close());

function call<Name extends ChannelName>(
  name: Name,
  request: ChannelRequest<Name>,
): ChannelResponse<Name> {
  return valueOf(callChannel(project.context, name, request));
}

function resultOf(trace: MeasureTrace, key: string): number | null | undefined {
  return trace.lines.find((line) => line.key === key)?.result.value;
}

/** The figures of the Plan's measure table, as plan.evaluate reports them. */
function expectPlanFigures(trace: MeasureTrace, measure: MeasureReport): void {
  expect(trace.rank).toBe(measure.rank);
  expect(resultOf(trace, 'cfm50-removed')).toBe(measure.cfm50Reduction);
  expect(resultOf(trace, 'cfm50-after')).toBe(measure.cfm50After);
  expect(resultOf(trace, 'heating-fuel-saved')).toBe(measure.annualSavings.heatingFuelUnits);
  expect(resultOf(trace, 'annual-savings')).toBe(measure.annualSavings.usd);
  expect(resultOf(trace, 'cost')).toBe(measure.costUsd);
  expect(resultOf(trace, 'pv-savings')).toBe(measure.pvSavingsUsd);
  expect(resultOf(trace, 'npv')).toBe(measure.npvUsd);
  expect(resultOf(trace, 'sir')).toBe(measure.sir);
  expect(resultOf(trace, 'simple-payback')).toBe(measure.simplePaybackYears);
  expect(resultOf(trace, 'cce')).toBe(measure.cceUsdPerMMBtu);
}

describe('plan.explain', () => {
  it('gives, for every measure of every stored demo home, the core’s trace of its exported file', () => {
    const demoHomes = call('homes.list', {}).filter((home) => home.isDemo);
    expect(demoHomes.length).toBeGreaterThan(0);
    let explained = 0;
    for (const { id: homeId } of demoHomes) {
      const report = call('plan.evaluate', { homeId });
      const evaluation = project.store.read((read) =>
        evaluateHome(exportHomeFile(read, homeId), { library: effectiveLibrary(read) }),
      );
      for (const measure of report.measures) {
        const trace = call('plan.explain', { homeId, measureId: measure.id });
        expect(trace, `${homeId} ${measure.id}`).toStrictEqual(
          explainMeasure(evaluation, measure.id),
        );
        expectPlanFigures(trace, measure);
        explained += 1;
      }
    }
    expect(explained).toBeGreaterThan(demoHomes.length);
  });

  it('reads without writing anything', () => {
    const home = call('homes.list', {}).find((candidate) => candidate.isDemo);
    if (!home) expect.fail('no demo home');
    const measureId = call('plan.evaluate', { homeId: home.id }).measures[0]?.id;
    if (measureId === undefined) expect.fail('the demo home has no measure');
    const digest = projectDigest(project.store.sqlite);
    call('plan.explain', { homeId: home.id, measureId });
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('follows the project’s library edits as plan.evaluate does', () => {
    const own = openChannelProject('sealwork-plan-explain-edit-');
    try {
      const { homeId } = addKnownRows(own.context);
      const measure = {
        id: 'lights',
        type: 'recessed-lights',
        byUnits: { units: 6 },
        cost: { materialsUsd: 60, laborHours: 3, laborRateUsdPerHour: 50 },
      };
      valueOf(callChannel(own.context, 'measures.add', { homeId, measure }));
      const explain = () =>
        valueOf(callChannel(own.context, 'plan.explain', { homeId, measureId: 'lights' }));
      const shippedEstimate = resultOf(explain(), 'estimate');
      valueOf(
        callChannel(own.context, 'library.saveEdit', {
          typeId: 'recessed-lights',
          edit: { sealingEffectiveness: { low: 0.2, likely: 0.3, high: 0.4 }, note: 'field data' },
        }),
      );
      const edited = explain();
      const report = valueOf(callChannel(own.context, 'plan.evaluate', { homeId }));
      const reported = report.measures.find((entry) => entry.id === 'lights');
      if (!reported) expect.fail('no measure "lights" in the report');
      expect(resultOf(edited, 'estimate')).not.toBe(shippedEstimate);
      expect(resultOf(edited, 'estimate')).toBe(reported.estimateCfm50.likely);
      const effectiveness = edited.lines
        .find((line) => line.key === 'estimate')
        ?.inputs.find((item) => item.label.startsWith('Share of that leakage'));
      expect(effectiveness?.value).toBe(0.3);
      expectPlanFigures(edited, reported);
    } finally {
      own.close();
    }
  });

  it('refuses a measure the home does not have, naming measureId', () => {
    const home = call('homes.list', {}).find((candidate) => candidate.isDemo);
    if (!home) expect.fail('no demo home');
    const reply = callChannel(project.context, 'plan.explain', {
      homeId: home.id,
      measureId: 'no-such-measure',
    });
    expect(refusalProblems(reply, { kind: 'invalid', field: 'measureId' })).toEqual([]);
    expect(reply.ok ? '' : reply.error.message).toMatch(/got "no-such-measure"/);
  });

  it('refuses a home that is not in the project, naming homeId', () => {
    const reply = callChannel(project.context, 'plan.explain', {
      homeId: 999_999,
      measureId: 'anything',
    });
    expect(refusalProblems(reply, { kind: 'notFound', field: 'homeId' })).toEqual([]);
  });

  it('refuses a malformed request before reading, naming the field', () => {
    for (const [request, field] of [
      [{ homeId: 1, measureId: '' }, 'measureId'],
      [{ homeId: 1, measureId: 'x'.repeat(65) }, 'measureId'],
      [{ homeId: 1 }, 'measureId'],
      [{ homeId: 0, measureId: 'm1' }, 'homeId'],
      [{ homeId: 1, measureId: 'm1', extra: true }, 'extra'],
    ] as const) {
      const reply: unknown = callChannel(project.context, 'plan.explain', request);
      expect(refusalProblems(reply, { kind: 'invalid', field }), JSON.stringify(request)).toEqual(
        [],
      );
    }
  });
});
