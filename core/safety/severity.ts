/** Ordering of severities: danger first. */
import type { CautionSeverity } from './types.ts';

const SEVERITY_RANK: Readonly<Record<CautionSeverity, number>> = {
  danger: 0,
  warning: 1,
  notice: 2,
};

/**
 * Compares two severities for sorting, danger → warning → notice.
 *
 * @param first - a severity
 * @param second - another severity
 * @returns negative when `first` is the more severe, 0 when equal, positive otherwise
 */
export function compareSeverity(first: CautionSeverity, second: CautionSeverity): number {
  return SEVERITY_RANK[first] - SEVERITY_RANK[second];
}

/**
 * The most severe of a list.
 *
 * @param severities - at least one severity
 * @returns the most severe one
 */
export function mostSevere(
  severities: readonly [CautionSeverity, ...CautionSeverity[]],
): CautionSeverity {
  return severities.reduce((worst, next) => (compareSeverity(next, worst) < 0 ? next : worst));
}
