/**
 * The generated homes and the queries the best-package tests hold to brute force
 * (test/_lib/package-brute-force.ts), shared by best-package.test.ts and
 * best-package-aim2.test.ts so both ask the same kinds of question.
 */
import fc from 'fast-check';
import type { Evaluation } from '../../core/evaluate.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { homeArbitrary } from './home-arbitrary.ts';
import { measuresInPlanOrder, type BruteForceQuery } from './package-brute-force.ts';

/**
 * Generated homes of 1 to `most` measures with a budget fraction and a query kind each. The
 * home generator marks about half its measures health and safety and a third declined; here
 * most are made energy measures again (all of them in half the homes), so the search has up to
 * `most` to choose from.
 */
export function generatedPackageHomes(options: {
  count: number;
  seed: number;
  most?: number;
  methods?: readonly HomeFileInput['infiltrationMethod'][];
}) {
  const { count, seed, most = 14, methods } = options;
  return fc.sample(
    fc
      .noBias(fc.integer({ min: 1, max: most }))
      .chain((measures) =>
        fc.record({
          home: homeArbitrary({
            measureCount: { min: measures, max: measures },
            ...(methods ? { methods } : {}),
          }),
          kinds: fc.array(
            fc.constantFrom('energy', 'energy', 'energy', 'energy', 'safety', 'declined'),
            { minLength: measures, maxLength: measures },
          ),
          allEnergy: fc.boolean(),
          budgetFraction: fc.constantFrom(0, 0.05, 0.2, 0.35, 0.5, 0.75, 1, 1.5),
          kind: fc.integer({ min: 0, max: 3 }),
        }),
      )
      .map(({ home, kinds, allEnergy, budgetFraction, kind }) => {
        home.measures.forEach((measure, index) => {
          const role = allEnergy ? 'energy' : (kinds[index] ?? 'energy');
          measure.status = role === 'declined' ? 'declined' : 'planned';
          measure.cost = { ...measure.cost, healthAndSafety: role === 'safety' };
        });
        return { home, budgetFraction, kind };
      }),
    { seed, numRuns: count },
  );
}

/** The four queries asked of one home: a budget from its energy cost, constraints by kind. */
export function packageQueriesFor(
  evaluation: Evaluation,
  budgetFraction: number,
  kind: number,
): BruteForceQuery[] {
  const energyCost = measuresInPlanOrder(evaluation).energy.reduce(
    (total, measure) => total + measure.cost.totalUsdFloat,
    0,
  );
  const budgetUsd = Math.round(energyCost * budgetFraction * 100) / 100;
  return [
    { budgetUsd, objective: 'npv', everyMeasureSirAtLeastOne: false, packageSirAtLeastOne: false },
    {
      budgetUsd: kind === 0 ? Infinity : budgetUsd,
      objective: 'savings',
      everyMeasureSirAtLeastOne: false,
      packageSirAtLeastOne: true,
    },
    {
      budgetUsd,
      objective: kind === 1 ? 'sir' : 'npv',
      everyMeasureSirAtLeastOne: true,
      packageSirAtLeastOne: kind === 2,
    },
    {
      budgetUsd,
      objective: 'savings',
      everyMeasureSirAtLeastOne: true,
      packageSirAtLeastOne: false,
    },
  ];
}

/**
 * A home's measures all planned as energy measures, their materials and labour hours scaled
 * by `costScale` (to the cent and the hundredth of an hour), for homes shaped to test one
 * corner of the search.
 */
export function plannedEnergyMeasures(
  measures: HomeFileInput['measures'],
  costScale: number,
): HomeFileInput['measures'] {
  return measures.map((measure) => ({
    ...measure,
    status: 'planned',
    cost: {
      ...measure.cost,
      healthAndSafety: false,
      ...(measure.cost.materialsUsd === undefined
        ? {}
        : { materialsUsd: Math.round(measure.cost.materialsUsd * costScale * 100) / 100 }),
      ...(measure.cost.laborHours === undefined
        ? {}
        : { laborHours: Math.round(measure.cost.laborHours * costScale * 100) / 100 }),
    },
  }));
}
