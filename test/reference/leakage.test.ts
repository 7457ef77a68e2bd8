/**
 * Blower-door leakage against outside references: the check values of the ASHRAE leakage-area
 * definitions, the `simple-statistics` package's regression on ln-ln data (the ASTM E779 fit),
 * and textbook least-squares formulas computed here, independently of the code under test.
 */
import { gammaln, linearRegression, rSquared } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { DEFAULT_FLOW_EXPONENT } from '../../core/constants.ts';
import { InputError } from '../../core/errors.ts';
import {
  ach50,
  cfm50FromElaIn2,
  cfm50PerEnvelopeFt2,
  elaIn2,
  eqlaIn2,
  estimateEnvelopeAreaFt2,
  fitMultipointTest,
  leakageAreaIn2,
  normalizedLeakage,
  onePointTest,
} from '../../core/leakage.ts';
import type { BlowerDoorPoint } from '../../core/leakage.ts';

/** A six-point depressurization test with realistic scatter (invented readings). */
const NOISY_TEST: readonly BlowerDoorPoint[] = [
  { pressurePa: 60, flowCfm: 2385 },
  { pressurePa: 52, flowCfm: 2160 },
  { pressurePa: 44, flowCfm: 1985 },
  { pressurePa: 35, flowCfm: 1712 },
  { pressurePa: 26, flowCfm: 1450 },
  { pressurePa: 15, flowCfm: 1010 },
];

function lnLn(points: readonly BlowerDoorPoint[]): number[][] {
  return points.map((point) => [Math.log(point.pressurePa), Math.log(point.flowCfm)]);
}

function problemsOf(call: () => unknown): string[] {
  try {
    call();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((problem) => problem.path);
    throw error;
  }
  throw new Error('expected an InputError');
}

/** Student's t CDF by Simpson's rule on the density, normalised with simple-statistics' gammaln. */
function studentTCdf(t: number, df: number): number {
  const logNorm = gammaln((df + 1) / 2) - gammaln(df / 2) - 0.5 * Math.log(df * Math.PI);
  const density = (x: number) => Math.exp(logNorm - ((df + 1) / 2) * Math.log(1 + (x * x) / df));
  const steps = 20_000;
  const h = t / steps;
  let sum = density(0) + density(t);
  for (let i = 1; i < steps; i++) sum += density(i * h) * (i % 2 === 0 ? 2 : 4);
  return 0.5 + (sum * h) / 3;
}

/** The two-sided 95 % critical value by bisection on the CDF. */
function tCritical95(df: number): number {
  let low = 1;
  let high = 20;
  for (let i = 0; i < 60; i++) {
    const mid = (low + high) / 2;
    if (studentTCdf(mid, df) < 0.975) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}

describe('REFERENCES check values (ASHRAE HoF ventilation and infiltration chapter)', () => {
  it('ACH50 of 2000 CFM50 in 16,000 ft³ is 7.500', () => {
    // ACH50 = CFM50·60/V (ANSI/RESNET/ICC 380).
    expect(ach50(2000, 16_000)).toBeCloseTo(7.5, 10);
  });

  it('ELA of 2000 CFM50 at n 0.65 is 109.7 in² (4 Pa, C_D 1, ρ 1.2)', () => {
    expect(elaIn2(2000, 0.65)).toBeCloseTo(109.7, 1);
  });

  it("CFM50/ELA is about 18.2, the trade's 'divide by 18'", () => {
    expect(2000 / elaIn2(2000, 0.65)).toBeCloseTo(18.2, 1);
  });

  it('EqLA of the same is 206.0 in² (10 Pa, C_D 0.611; CGSB-149.10, from memory)', () => {
    expect(eqlaIn2(2000, 0.65)).toBeCloseTo(206.0, 1);
  });

  it('the general leakage area reduces to ELA at 4 Pa and C_D 1', () => {
    const general = leakageAreaIn2({
      cfm50: 2000,
      exponentN: 0.65,
      referencePressurePa: 4,
      dischargeCoefficient: 1,
      airDensityKgPerM3: 1.2,
    });
    expect(general).toBeCloseTo(elaIn2(2000, 0.65), 12);
  });

  it('cfm50FromElaIn2 inverts elaIn2 exactly', () => {
    for (const exponentN of [0.5, 0.6, 0.65, 0.72, 1]) {
      for (const cfm50 of [250, 1234.5, 6000]) {
        expect(cfm50FromElaIn2(elaIn2(cfm50, exponentN), exponentN) / cfm50 - 1).toBeCloseTo(0, 12);
      }
    }
  });
});

describe('multipoint fit (ASTM E779 least squares in log-log space)', () => {
  it('matches simple-statistics linearRegression and rSquared on the ln-ln data', () => {
    const fit = fitMultipointTest(NOISY_TEST);
    const data = lnLn(NOISY_TEST);
    const { m, b } = linearRegression(data);
    expect(fit.exponentN).toBeCloseTo(m, 12);
    expect(Math.log(fit.coefficientCfmPerPaN)).toBeCloseTo(b, 12);
    expect(fit.rSquared).toBeCloseTo(
      rSquared(data, (x) => b + m * x),
      12,
    );
    expect(fit.cfm50).toBeCloseTo(Math.exp(b + m * Math.log(50)), 8);
    expect(fit.pointCount).toBe(6);
    expect(fit.warnings).toEqual([]);
  });

  it('recovers C and n exactly from noise-free power-law points', () => {
    const coefficient = 151.3;
    const exponent = 0.617;
    const points = [10, 20, 30, 40, 50, 60].map((pressurePa) => ({
      pressurePa,
      flowCfm: coefficient * pressurePa ** exponent,
    }));
    const fit = fitMultipointTest(points);
    expect(fit.exponentN).toBeCloseTo(exponent, 12);
    expect(fit.coefficientCfmPerPaN / coefficient - 1).toBeCloseTo(0, 12);
    expect(fit.rSquared).toBeCloseTo(1, 12);
    expect(fit.standardErrorN).toBeCloseTo(0, 9);
    expect(fit.cfm50High95! / fit.cfm50 - 1).toBeCloseTo(0, 9);
  });

  it('gives standard errors equal to the textbook s²·(XᵀX)⁻¹ form', () => {
    // Independent path: residuals from simple-statistics' line, variances from the
    // diagonal of s²·(XᵀX)⁻¹ (any regression text, e.g. Draper & Smith, Applied Regression
    // Analysis, ch. 1), rather than the code's centred sums.
    const data = lnLn(NOISY_TEST);
    const { m, b } = linearRegression(data);
    const count = data.length;
    const sumX = data.reduce((sum, [x]) => sum + x!, 0);
    const sumX2 = data.reduce((sum, [x]) => sum + x! * x!, 0);
    const sse = data.reduce((sum, [x, y]) => sum + (y! - b - m * x!) ** 2, 0);
    const variance = sse / (count - 2);
    const determinant = count * sumX2 - sumX * sumX;
    const fit = fitMultipointTest(NOISY_TEST);
    expect(fit.standardErrorN).toBeCloseTo(Math.sqrt((variance * count) / determinant), 12);
    expect(fit.standardErrorLnC).toBeCloseTo(Math.sqrt((variance * sumX2) / determinant), 12);
  });

  /** n readings from 10 to 60 Pa with a fixed ±3 % wobble, so the band is not trivial. */
  function scatteredTest(count: number): BlowerDoorPoint[] {
    return Array.from({ length: count }, (_, i) => {
      const pressurePa = 10 + (50 * i) / (count - 1);
      return { pressurePa, flowCfm: 140 * pressurePa ** 0.64 * (1 + 0.03 * Math.sin(7 * i + 1)) };
    });
  }

  it.each([
    ['3 readings (1 df)', scatteredTest(3)],
    ['6 readings (4 df)', NOISY_TEST],
    ['35 readings (33 df, between table rows)', scatteredTest(35)],
  ])(
    "gives a 95 %% CFM50 band from Student's t and the mean-response variance: %s",
    (_, points) => {
      // t from the t distribution itself (numerical integration, normalised with
      // simple-statistics' gammaln); the code uses the NIST/SEMATECH table to 3 decimals,
      // so hold the band's half-width to 0.05 %.
      const data = lnLn(points);
      const { m, b } = linearRegression(data);
      const count = data.length;
      const meanX = data.reduce((sum, [x]) => sum + x!, 0) / count;
      const sxx = data.reduce((sum, [x]) => sum + (x! - meanX) ** 2, 0);
      const s = Math.sqrt(
        data.reduce((sum, [x, y]) => sum + (y! - b - m * x!) ** 2, 0) / (count - 2),
      );
      const halfWidth =
        tCritical95(count - 2) * s * Math.sqrt(1 / count + (Math.log(50) - meanX) ** 2 / sxx);
      const fit = fitMultipointTest(points);
      expect(Math.log(fit.cfm50High95! / fit.cfm50) / halfWidth - 1).toBeCloseTo(0, 3);
      expect(Math.log(fit.cfm50 / fit.cfm50Low95!) / halfWidth - 1).toBeCloseTo(0, 3);
    },
  );

  it('leaves the uncertainty unknown with exactly two points', () => {
    const fit = fitMultipointTest([
      { pressurePa: 50, flowCfm: 2000 },
      { pressurePa: 20, flowCfm: 1100 },
    ]);
    expect(fit.exponentN).toBeCloseTo(Math.log(2000 / 1100) / Math.log(50 / 20), 12);
    expect(fit.cfm50).toBeCloseTo(2000, 9);
    expect(fit.standardErrorLnC).toBeNull();
    expect(fit.standardErrorN).toBeNull();
    expect(fit.rSquared).toBeNull();
    expect(fit.cfm50Low95).toBeNull();
  });

  it('does not change its input', () => {
    const points = NOISY_TEST.map((point) => Object.freeze({ ...point }));
    const copy = structuredClone(points);
    fitMultipointTest(Object.freeze(points));
    expect(points).toEqual(copy);
  });
});

describe('warnings (common practice and ASTM E779 exponent range)', () => {
  it('flags few points and a narrow pressure span', () => {
    const fit = fitMultipointTest([
      { pressurePa: 50, flowCfm: 2000 },
      { pressurePa: 40, flowCfm: 1730 },
      { pressurePa: 30, flowCfm: 1440 },
    ]);
    expect(fit.warnings.map((warning) => warning.code)).toEqual([
      'few-points',
      'narrow-pressure-span',
    ]);
  });

  it('flags an exponent outside 0.5–1.0', () => {
    const points = [15, 25, 35, 45, 55, 65].map((pressurePa) => ({
      pressurePa,
      flowCfm: 300 * pressurePa ** 0.42,
    }));
    const codes = fitMultipointTest(points).warnings.map((warning) => warning.code);
    expect(codes).toEqual(['exponent-out-of-range']);
    expect(onePointTest(2000, 1.1).warnings.map((warning) => warning.code)).toEqual([
      'exponent-out-of-range',
    ]);
  });
});

describe('bad multipoint input names each field at fault', () => {
  it.each([
    [[], ['points']],
    [[{ pressurePa: 50, flowCfm: 2000 }], ['points']],
    [
      [
        { pressurePa: 50, flowCfm: 2000 },
        { pressurePa: 40, flowCfm: 1700 },
        { pressurePa: 0, flowCfm: 1400 },
      ],
      ['points[2].pa'],
    ],
    [
      [
        { pressurePa: 50, flowCfm: 2000 },
        { pressurePa: 40, flowCfm: Number.NaN },
        { pressurePa: -5, flowCfm: -1 },
      ],
      ['points[1].cfm', 'points[2].pa', 'points[2].cfm'],
    ],
    [
      [
        { pressurePa: 50, flowCfm: 2000 },
        { pressurePa: 50, flowCfm: 2010 },
      ],
      ['points'],
    ],
  ] as [BlowerDoorPoint[], string[]][])('%j → %j', (points, fields) => {
    expect(problemsOf(() => fitMultipointTest(points))).toEqual(fields);
  });

  it.each([
    ['cfm50', () => onePointTest(-1)],
    ['exponentN', () => onePointTest(2000, 65)],
    ['volumeFt3', () => ach50(2000, 0)],
    [
      'dischargeCoefficient',
      () =>
        leakageAreaIn2({
          cfm50: 2000,
          exponentN: 0.65,
          referencePressurePa: 4,
          dischargeCoefficient: 0,
        }),
    ],
    ['elaIn2', () => cfm50FromElaIn2(Number.NaN, 0.65)],
    ['floorAreaFt2', () => normalizedLeakage({ elaIn2: 100, floorAreaFt2: 0, heightFt: 8 })],
    ['stories', () => estimateEnvelopeAreaFt2({ floorAreaFt2: 1500, stories: 0, heightFt: 8 })],
  ])('%s', (field, call) => {
    expect(problemsOf(call)).toEqual([field]);
  });
});

describe('one-point test, normalized leakage and envelope area', () => {
  it('takes C = CFM50/50ⁿ with n 0.65 by default (ASTM E1827, RESNET 380; from memory)', () => {
    expect(DEFAULT_FLOW_EXPONENT).toBe(0.65);
    const fit = onePointTest(2000);
    expect(fit.exponentN).toBe(0.65);
    expect(fit.coefficientCfmPerPaN).toBeCloseTo(2000 / 50 ** 0.65, 10);
    expect(fit.standardErrorN).toBeNull();
    expect(fit.warnings).toEqual([]);
  });

  it('follows ASHRAE Std 119: NL = 1000·(ELA/A_floor)·(H/8.2 ft)^0.3 (exponent from memory)', () => {
    // At the reference height the height term is 1: 144 in² of ELA over 1000 ft² is NL 1.
    expect(normalizedLeakage({ elaIn2: 144, floorAreaFt2: 1000, heightFt: 8.2 })).toBeCloseTo(
      1,
      12,
    );
    const twoStory = normalizedLeakage({ elaIn2: 144, floorAreaFt2: 1000, heightFt: 16.4 });
    expect(twoStory).toBeCloseTo(2 ** 0.3, 12);
  });

  it('estimates a box envelope: square footprint, walls, ceiling and floor (common practice)', () => {
    // 1600 ft² one story, 8 ft walls: 40 ft × 40 ft; walls 160 ft × 8 ft = 1280 ft²;
    // ceiling and floor 1600 ft² each.
    expect(estimateEnvelopeAreaFt2({ floorAreaFt2: 1600, stories: 1, heightFt: 8 })).toBeCloseTo(
      4480,
      9,
    );
    // The same floor area on two stories, 16 ft of wall: 800 ft² footprint.
    const twoStory = estimateEnvelopeAreaFt2({ floorAreaFt2: 1600, stories: 2, heightFt: 16 });
    expect(twoStory).toBeCloseTo(4 * Math.sqrt(800) * 16 + 1600, 9);
    expect(cfm50PerEnvelopeFt2(2240, 4480)).toBeCloseTo(0.5, 12);
  });
});
