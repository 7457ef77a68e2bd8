/**
 * The best-package search held to brute force on one query: the search's package is the one
 * `bestByBruteForce` picks from every package replayed (package-brute-force.ts), to the cent,
 * and within the budget. Shared by the best-package tests of every method.
 */
import { expect } from 'vitest';
import type { Evaluation } from '../../core/evaluate.ts';
import { bestPackage, type BestPackage } from '../../core/plan/best-package.ts';
import {
  bestByBruteForce,
  type BruteForceQuery,
  type ReplayedPackage,
} from './package-brute-force.ts';

/**
 * Runs the search for `query` and expects brute force's package and figures.
 *
 * @param label - names the home in a failure, with the query
 * @returns the search's result, for a test's own further checks
 */
export function expectBruteForceBest(
  evaluation: Evaluation,
  packages: readonly ReplayedPackage[],
  query: BruteForceQuery,
  label: string,
): BestPackage {
  const expected = bestByBruteForce(packages, query);
  const found = bestPackage(evaluation, { ...query });
  const context = `${label}, ${JSON.stringify(query)}`;
  expect(found.measureIds, context).toEqual(expected.measureIds);
  expect(found.npvUsd.toFixed(2), context).toBe(expected.npvUsd.toFixed(2));
  expect(found.annualSavingsUsd.toFixed(2), context).toBe(expected.annualSavingsUsd.toFixed(2));
  expect(found.costUsd.toFixed(2), context).toBe(expected.costUsd.toFixed(2));
  expect(found.sir?.toString() ?? null, context).toBe(expected.sir?.toString() ?? null);
  // Respects the budget; the energy measures' cost is what it covers.
  expect(found.budgetCostUsd.lte(query.budgetUsd), context).toBe(true);
  return found;
}
