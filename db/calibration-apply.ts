/**
 * Putting the program's realization factors to use: the factors fitted over the tested homes
 * (db/portfolio-plans.ts) are written into the calibration of each chosen home whose work has
 * not started (job audited, scoped or approved), so its plan scales the estimates of those types and
 * says so (core/measures.ts, the report's notes). Only factors that rest on enough homes are
 * applied. Removing the calibration gives the estimates back exactly: the measures themselves
 * are never changed.
 */
import type { Calibration } from '../core/schema.ts';
import { evaluatePortfolio, type PortfolioSelection } from './portfolio-plans.ts';
import { getHome, listHomes, setHomeData } from './repositories/homes.ts';
import type { ReadAccess, WriteAccess } from './store.ts';

/** Jobs whose estimates may still change: the work has not started. */
const NOT_STARTED = new Set(['audited', 'scoped', 'approved']);

export interface CalibrationOutcome {
  /** The homes whose calibration was written (or removed). */
  homeIds: number[];
  /** The factors written; empty when removing. */
  factors: Calibration['factors'];
  /** Types of the fit left out, and why. */
  leftOut: { type: string; reason: string }[];
}

function chosenIds(read: ReadAccess, selection: PortfolioSelection): number[] {
  if ('homeIds' in selection) return [...selection.homeIds];
  return listHomes(read, { ...selection.filter, limit: 20_000 }).map((home) => home.id);
}

/**
 * Writes the fitted factors into the chosen homes not yet started.
 *
 * @param basis - what the factors come from, in words, and the day they were applied
 * @returns the homes written and the factors; none when no factor rests on enough homes
 */
export function applyCalibration(
  write: WriteAccess,
  selection: PortfolioSelection,
  basis: Calibration['basis'],
): CalibrationOutcome {
  // The fit is over every tested home of the project, whichever homes receive it.
  const fit = evaluatePortfolio(write, { filter: {} }).calibration;
  const leftOut: CalibrationOutcome['leftOut'] = [];
  const factors: Calibration['factors'] = [];
  for (const type of fit?.types ?? []) {
    if (type.factor === null) leftOut.push({ type: type.typeId, reason: 'not determined' });
    else if (type.fewHomes) leftOut.push({ type: type.typeId, reason: `only ${type.homes} homes` });
    else {
      factors.push({
        type: type.typeId,
        factor: type.factor,
        homes: type.homes,
        ...(type.interval
          ? { intervalLow: type.interval.low, intervalHigh: type.interval.high }
          : {}),
      });
    }
  }
  // Nothing rests on enough tested homes yet: nothing is written, and the outcome says why.
  if (factors.length === 0) return { homeIds: [], factors, leftOut };
  const homeIds = chosenIds(write, selection).filter((homeId) =>
    NOT_STARTED.has(getHome(write, homeId).jobStatus),
  );
  for (const homeId of homeIds) {
    const home = getHome(write, homeId);
    setHomeData(write, homeId, { ...home.data, calibration: { basis, factors } });
  }
  return { homeIds, factors, leftOut };
}

/** Removes the calibration from the chosen homes that have one. */
export function removeCalibration(
  write: WriteAccess,
  selection: PortfolioSelection,
): CalibrationOutcome {
  const homeIds = chosenIds(write, selection).filter(
    (homeId) => getHome(write, homeId).data.calibration !== undefined,
  );
  for (const homeId of homeIds) {
    const { calibration: _removed, ...data } = getHome(write, homeId).data;
    setHomeData(write, homeId, data);
  }
  return { homeIds, factors: [], leftOut: [] };
}
