/**
 * The ranges of a proposal's options and of any chosen package (core/uncertainty/
 * package-ranges.ts, core/choices.ts). Independent check: on generated homes whose every
 * estimate is a single figure (low = likely = high), each draw is that figure, so every
 * option's P10, P50 and P90 must equal the option's exact Decimal figures (core/plan/
 * best-package.ts packageFigures, which replays the package with the plan's own step and
 * worth) — whatever the package's measures, health-and-safety ones first, floor and fan.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { proposalOptionsReport, reportWithChoices } from '../../core/choices.ts';
import { evaluateHome } from '../../core/evaluate.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { measuresUncertainty } from '../../core/uncertainty/package-ranges.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';
import { validBaseHome } from '../_lib/base-home.ts';

const SEED = 61;
const HOMES = 40;

/** The home with each measure's estimate replaced by its likely CFM50, low = likely = high. */
function withoutSpread(home: HomeFileInput): HomeFileInput {
  const prepared = evaluateHome(home).plan.entries.map((entry) => entry.step.measure);
  return {
    ...home,
    measures: home.measures.map((measure) => {
      const likely = prepared.find((each) => each.id === measure.id)?.estimateCfm50.likely ?? 0;
      const {
        byUnits: _units,
        shareOfLocation: _share,
        reductionCfm50: _direct,
        ...rest
      } = measure as typeof measure & Record<string, unknown>;
      return { ...rest, reductionCfm50: { low: likely, likely, high: likely } };
    }),
  } as HomeFileInput;
}

const homes = fc
  .sample(homeArbitrary({ measureCount: { min: 1, max: 8 } }), { seed: SEED, numRuns: HOMES })
  .map(withoutSpread);

describe("options' ranges", () => {
  it('collapse to each option’s exact figures when no estimate has a spread', () => {
    let methods = new Set<string>();
    for (const home of homes) {
      const evaluation = evaluateHome(home);
      methods = methods.add(evaluation.home.infiltrationMethod);
      const options = proposalOptionsReport(evaluation, { draws: 64, seed: 5 });
      for (const option of options) {
        const range = option.range;
        expect(range, option.id).not.toBeNull();
        for (const percentile of ['p10', 'p50', 'p90'] as const) {
          expect(range?.npvUsd[percentile]).toBeCloseTo(option.npvUsd, 1);
          expect(range?.annualSavingsUsd[percentile]).toBeCloseTo(option.annualSavingsUsd, 1);
        }
        const sirHolds = option.sir === null ? 0 : option.sir >= 1 ? 1 : 0;
        // A SIR within rounding of 1 may fall either way in float64; none of these homes does.
        if (option.sir === null || Math.abs(option.sir - 1) > 1e-3) {
          expect(range?.chanceSirAtLeastOne).toBe(sirHolds);
        }
      }
    }
    expect(methods.size).toBeGreaterThan(1);
  });

  it('spread when the estimates do, in order, with the same figures for the same seed', () => {
    const evaluation = evaluateHome(validBaseHome());
    const first = proposalOptionsReport(evaluation, { draws: 2000, seed: 9 });
    const again = proposalOptionsReport(evaluation, { draws: 2000, seed: 9 });
    expect(again).toEqual(first);
    for (const option of first) {
      const npv = option.range?.npvUsd;
      if (option.measureIds.length === 0 || !npv) continue;
      expect(npv.p10).toBeLessThan(npv.p50);
      expect(npv.p50).toBeLessThan(npv.p90);
    }
  });

  it('leaves the range out when no run is asked for', () => {
    const options = proposalOptionsReport(evaluateHome(validBaseHome()));
    expect(options.map((option) => option.range)).toEqual([null, null, null]);
  });

  it('refuses a package with a measure the home does not have, naming measureIds', () => {
    const evaluation = evaluateHome(validBaseHome());
    expectInputError(
      () => measuresUncertainty(evaluation, ['m1', 'no-such'], { draws: 10, seed: 1 }),
      'measureIds',
      /"no-such" is not one of the home's measures/,
    );
  });
});

describe('the report with choices', () => {
  it('adds nothing unless asked, and names a bad option', () => {
    const evaluation = evaluateHome(validBaseHome());
    const plain = reportWithChoices(evaluation, {});
    expect(plain.uncertainty).toBeUndefined();
    expect(plain.bestPackage).toBeUndefined();
    expectInputError(() => reportWithChoices(evaluation, { draws: 1.5 }), 'draws', /whole number/);
    expectInputError(
      () => reportWithChoices(evaluation, { budget: { budgetUsd: -1 } }),
      'budgetUsd',
      /at least 0/,
    );
  });
});
