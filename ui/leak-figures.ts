/**
 * The figures of one blower-door test, computed with core/leakage.ts from its readings (or
 * its one point) and the house: the power law, ACH50, ELA and normalized leakage.
 */
import {
  ach50,
  elaIn2,
  fitMultipointTest,
  normalizedLeakage,
  onePointTest,
  type LeakageFit,
} from '../core/leakage.ts';
import type { House, OtherLeakageTest } from '../core/schema.ts';

export interface TestFigures {
  fit: LeakageFit;
  /** ACH50, 1/h; null without the house volume. */
  ach50: number | null;
  /** ELA at 4 Pa, in². */
  elaIn2: number;
  /** Normalized leakage, dimensionless; null without the house floor area and height. */
  normalizedLeakage: number | null;
}

export type FiguresOutcome = { ok: true; figures: TestFigures } | { ok: false; message: string };

/** The power law of a test: fitted from its readings, or from its one point and exponent. */
function fitOf(test: OtherLeakageTest): LeakageFit {
  if (test.points !== undefined) {
    return fitMultipointTest(
      test.points.map((point) => ({ pressurePa: point.pa, flowCfm: point.cfm })),
    );
  }
  if (test.cfm50 === undefined) throw new Error('a test holds neither readings nor a CFM50');
  return test.exponentN === undefined
    ? onePointTest(test.cfm50)
    : onePointTest(test.cfm50, test.exponentN);
}

/**
 * A test's figures, or the core's words for why they cannot be computed.
 *
 * @param test - the stored test (CFM50 in cfm, readings in Pa and cfm)
 * @param house - the house, for its volume (ft³), floor area (ft²) and height (ft); null when
 *   the home has none yet
 */
export function figuresOf(test: OtherLeakageTest, house: House | null): FiguresOutcome {
  try {
    const fit = fitOf(test);
    const ela = elaIn2(fit.cfm50, fit.exponentN);
    return {
      ok: true,
      figures: {
        fit,
        ach50: house === null ? null : ach50(fit.cfm50, house.conditionedVolumeFt3),
        elaIn2: ela,
        normalizedLeakage:
          house === null
            ? null
            : normalizedLeakage({
                elaIn2: ela,
                floorAreaFt2: house.conditionedFloorAreaFt2,
                heightFt: house.heightFt,
              }),
      },
    };
  } catch (error) {
    return { ok: false, message: error instanceof Error ? error.message : String(error) };
  }
}

interface TestLike {
  planBasis: boolean;
  test: OtherLeakageTest;
}

/**
 * The test-in the plan is built on, by the store's rule (db/home-file.ts `planTestOf`): the
 * one marked as the plan's basis; else the latest dated, the first listed among equals.
 */
export function planTestIn<Record extends TestLike>(tests: readonly Record[]): Record | undefined {
  const marked = tests.find((record) => record.planBasis && record.test.kind === 'testIn');
  if (marked) return marked;
  let chosen: Record | undefined;
  for (const record of tests) {
    if (record.test.kind !== 'testIn') continue;
    if (chosen === undefined || (record.test.testedOn ?? '') > (chosen.test.testedOn ?? '')) {
      chosen = record;
    }
  }
  return chosen;
}

/** The latest test-out (by date, the last listed among equals), to set beside the test-in. */
export function latestTestOut<Record extends TestLike>(
  tests: readonly Record[],
): Record | undefined {
  let chosen: Record | undefined;
  for (const record of tests) {
    if (record.test.kind !== 'testOut') continue;
    if (chosen === undefined || (record.test.testedOn ?? '') >= (chosen.test.testedOn ?? '')) {
      chosen = record;
    }
  }
  return chosen;
}

/** Pressures spaced evenly in log space across the readings, for drawing the fitted law. */
export function fitLinePressuresPa(points: readonly { pa: number }[], count = 24): number[] {
  const pressures = points.map((point) => point.pa);
  const lowLn = Math.log(Math.min(...pressures));
  const highLn = Math.log(Math.max(...pressures, 50));
  return Array.from({ length: count }, (_, index) =>
    Math.exp(lowLn + ((highLn - lowLn) * index) / (count - 1)),
  );
}
