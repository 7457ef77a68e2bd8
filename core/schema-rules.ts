/**
 * Rules of the home file that tie fields together (an electric furnace, a heat pump rated
 * as a fraction, a method missing the climate data it needs, …). Each rule names the fields
 * it reads and runs whenever those fields parsed cleanly, even when other fields did not, so
 * one typo elsewhere never hides these problems and a field already refused is not blamed
 * twice.
 */
import type { HomeFile, Measure } from './schema.ts';
import { InputError } from './errors.ts';
import { fitMultipointTest } from './leakage.ts';
import { findMeasureType, MEASURE_LIBRARY } from './measure-library.ts';

export interface PathProblem {
  path: (string | number)[];
  message: string;
}

interface Rule {
  /** Dotted paths the rule reads (`house.conditionedVolumeFt3`, `measures[2].id`). */
  reads: (home: HomeFile) => string[];
  check: (home: HomeFile) => PathProblem[];
}

const ELECTRIC_EQUIPMENT = new Set(['heatPump', 'electricResistance']);

const RULES: readonly Rule[] = [
  {
    reads: () => ['house.conditionedVolumeFt3', 'house.conditionedFloorAreaFt2'],
    check: ({ house }) => {
      const meanCeilingFt = house.conditionedVolumeFt3 / house.conditionedFloorAreaFt2;
      if (meanCeilingFt >= 5 && meanCeilingFt <= 30) return [];
      return [
        {
          path: ['house', 'conditionedVolumeFt3'],
          message: `volume ÷ floor area gives a mean ceiling height of ${meanCeilingFt.toFixed(1)} ft; expected 5 to 30 ft`,
        },
      ];
    },
  },
  {
    reads: () => ['heating.equipment', 'heating.fuel'],
    check: ({ heating }) => {
      const electricOnly = ELECTRIC_EQUIPMENT.has(heating.equipment);
      if (electricOnly && heating.fuel !== 'electricity') {
        return [
          {
            path: ['heating', 'fuel'],
            message: `expected "electricity" for a ${heating.equipment}`,
          },
        ];
      }
      if (!electricOnly && heating.fuel === 'electricity') {
        return [
          {
            path: ['heating', 'equipment'],
            message: 'expected "heatPump" or "electricResistance" for electric heating',
          },
        ];
      }
      return [];
    },
  },
  {
    reads: () => ['heating.equipment', 'heating.efficiency'],
    check: ({ heating }) => {
      if (heating.equipment === 'heatPump') {
        return heating.efficiency >= 3 && heating.efficiency <= 20
          ? []
          : [
              {
                path: ['heating', 'efficiency'],
                message: `expected HSPF in Btu/Wh (3 to 20) for a heat pump, got ${heating.efficiency}`,
              },
            ];
      }
      return heating.efficiency >= 0.3 && heating.efficiency <= 1
        ? []
        : [
            {
              path: ['heating', 'efficiency'],
              message: `expected AFUE or COP as a fraction from 0.3 to 1 (0.8 for 80 %), got ${heating.efficiency}`,
            },
          ];
    },
  },
  {
    reads: () => ['heating.fuel', 'heating.combustionVenting'],
    check: ({ heating }) =>
      heating.fuel === 'electricity' &&
      heating.combustionVenting &&
      heating.combustionVenting !== 'none'
        ? [
            {
              path: ['heating', 'combustionVenting'],
              message:
                'electric heating has no combustion venting; expected "none" or leave it out',
            },
          ]
        : [],
  },
  {
    reads: () => ['heating.fuel', 'prices', 'cooling'],
    check: (home) => {
      const problems: PathProblem[] = [];
      const fuel = home.heating.fuel;
      if (home.prices[fuel] === undefined) {
        problems.push({
          path: ['prices', fuel],
          message: 'is required: expected the price of the heating fuel { usdPerUnit }',
        });
      }
      if (home.cooling && fuel !== 'electricity' && home.prices.electricity === undefined) {
        problems.push({
          path: ['prices', 'electricity'],
          message: 'is required for cooling: expected { usdPerUnit } per kWh',
        });
      }
      return problems;
    },
  },
  {
    reads: () => ['infiltrationMethod', 'nFactorOverride', 'climate', 'cooling'],
    check: methodInputProblems,
  },
  {
    reads: () => ['leakShares'],
    check: ({ leakShares }) => {
      if (!leakShares) return [];
      const total = leakShares.ceiling + leakShares.wall + leakShares.floor + leakShares.flue;
      return Math.abs(total - 1) <= 0.001
        ? []
        : [
            {
              path: ['leakShares'],
              message: `expected ceiling + wall + floor + flue = 1, got ${total.toFixed(3)}`,
            },
          ];
    },
  },
  {
    reads: () => ['leakageTest.points'],
    check: ({ leakageTest }) => (leakageTest.points ? pointProblems(leakageTest.points) : []),
  },
];

/** The climate data each infiltration method needs. */
function methodInputProblems(home: HomeFile): PathProblem[] {
  const { climate, infiltrationMethod: method } = home;
  const problems: PathProblem[] = [];
  if (
    method === 'nFactor' &&
    home.nFactorOverride === undefined &&
    climate.nFactorZone === undefined
  ) {
    problems.push({
      path: ['climate', 'nFactorZone'],
      message:
        'is required for infiltrationMethod "nFactor" unless nFactorOverride is given: expected 1 to 4',
    });
  }
  // Hour by hour, the hours stand in for the season means.
  if ((method === 'lblBasic' || method === 'aim2') && home.hourlyWeather === undefined) {
    if (climate.heatingSeason === undefined) {
      problems.push({
        path: ['climate', 'heatingSeason'],
        message: `is required for infiltrationMethod "${method}": expected { meanDeltaTF, meanWindSpeedMph }`,
      });
    }
    if (home.cooling && climate.coolingSeason === undefined) {
      problems.push({
        path: ['climate', 'coolingSeason'],
        message: `is required for infiltrationMethod "${method}" with cooling: expected { meanDeltaTF, meanWindSpeedMph }`,
      });
    }
  }
  if (method === 'ashrae622' && climate.wsf === undefined) {
    problems.push({
      path: ['climate', 'wsf'],
      message:
        'is required for infiltrationMethod "ashrae622": expected the weather and shielding factor of the nearest station (62.2 normative appendix)',
    });
  }
  return problems;
}

/** Readings that cannot be fitted, reported at the home file's own paths. */
function pointProblems(
  points: NonNullable<HomeFile['leakageTest']['points']>,
  at: (string | number)[] = ['leakageTest'],
): PathProblem[] {
  try {
    const fit = fitMultipointTest(
      points.map((point) => ({ pressurePa: point.pa, flowCfm: point.cfm })),
    );
    if (fit.exponentN < 0.3 || fit.exponentN > 1.2) {
      return [
        {
          path: [...at, 'points'],
          message: `the readings fit a flow exponent n of ${fit.exponentN.toFixed(2)}; expected 0.3 to 1.2 (0.5 to 1 in practice): check the readings`,
        },
      ];
    }
    return [];
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return error.problems.map((problem) => ({
      path: [...at, ...pathKeys(problem.path.startsWith('points') ? problem.path : 'points')],
      message: problem.message,
    }));
  }
}

/** `points[2].pa` → `['points', 2, 'pa']`. */
function pathKeys(path: string): (string | number)[] {
  return path
    .split(/\.|\[|\]/)
    .filter((key) => key !== '')
    .map((key) => (/^\d+$/.test(key) ? Number(key) : key));
}

/** Per-measure rules, each measure checked on its own so one bad measure hides no other. */
function measureRules(measures: readonly Measure[]): Rule[] {
  const rules: Rule[] = [];
  measures.forEach((measure, index) => {
    const at = `measures[${index}]`;
    rules.push({
      reads: () => [`${at}.type`],
      check: () =>
        findMeasureType(measure.type)
          ? []
          : [
              {
                path: ['measures', index, 'type'],
                message: `expected a measure type from the library (${MEASURE_LIBRARY.map((t) => t.id).join(', ')}), got "${measure.type}"`,
              },
            ],
    });
    rules.push({
      reads: () => [`${at}.reductionCfm50`, `${at}.byUnits`, `${at}.shareOfLocation`],
      check: () => {
        const estimates = [measure.reductionCfm50, measure.byUnits, measure.shareOfLocation].filter(
          (estimate) => estimate !== undefined,
        );
        return estimates.length === 1
          ? []
          : [
              {
                path: ['measures', index],
                message:
                  'expected exactly one estimate: reductionCfm50 { low, likely, high }, byUnits { units } or shareOfLocation { share }',
              },
            ];
      },
    });
    const firstIndex = measures.findIndex((other) => other.id === measure.id);
    if (firstIndex !== index) {
      rules.push({
        reads: () => [`${at}.id`, `measures[${firstIndex}].id`],
        check: () => [
          {
            path: ['measures', index, 'id'],
            message: `expected a unique id; "${measure.id}" is used twice`,
          },
        ],
      });
    }
  });
  return rules;
}

/** True when a problem at `issuePath` concerns the field at `readPath` (one contains the other). */
function overlaps(issuePath: string, readPath: string): boolean {
  const within = (inner: string, outer: string) =>
    outer === '' ||
    inner === outer ||
    inner.startsWith(`${outer}.`) ||
    inner.startsWith(`${outer}[`);
  return within(issuePath, readPath) || within(readPath, issuePath);
}

/**
 * The problems of every rule whose fields parsed cleanly.
 *
 * @param home - the parsed value; fields named in `badPaths` may hold anything
 * @param badPaths - paths zod has already refused
 */
export function crossFieldProblems(home: HomeFile, badPaths: readonly string[]): PathProblem[] {
  if (badPaths.includes('') || typeof home !== 'object' || home === null) return [];
  const clean = (paths: string[]) =>
    paths.every((path) => !badPaths.some((bad) => overlaps(bad, path)));
  // Entries zod refused may be anything (null, a number): the rules read only objects.
  const measures: readonly Measure[] = Array.isArray(home.measures)
    ? home.measures.map((measure) =>
        typeof measure === 'object' && measure !== null ? measure : ({} as Measure),
      )
    : [];
  const otherTests = Array.isArray(home.otherLeakageTests) ? home.otherLeakageTests : [];
  const otherTestRules: Rule[] = otherTests.map((test, index) => ({
    reads: () => [`otherLeakageTests[${index}].points`],
    check: () => (test.points ? pointProblems(test.points, ['otherLeakageTests', index]) : []),
  }));
  const rules = [...RULES, ...measureRules(measures), ...otherTestRules];
  return rules.flatMap((rule) => {
    let reads: string[];
    try {
      reads = rule.reads(home);
    } catch {
      return [];
    }
    return clean(reads) ? rule.check(home) : [];
  });
}
