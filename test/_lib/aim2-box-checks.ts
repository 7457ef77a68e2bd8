/**
 * The AIM-2 box bounds held to the model, for the degree-day and the hourly AIM-2 tests:
 * - `checkStateInBox`: (c) of core/plan/best-package/bounds-aim2.ts, a state's flow per
 *   CFM50 within the box's range for each season (heating, cooling, and hour by hour the
 *   latent load), and its fall for a step at each location within D_l;
 * - `checkStepDollars`: (e), for states s drawn in a home's box at test-in and s′ = s − a·e_l
 *   (a within the room), a year's heating and electricity dollars from `model.energyOf`
 *   (natural flow, the 62.2 fan and its power; hour by hour the latent load too) fall by at
 *   most a·slope of `stepSlopes`.
 */
import { expect } from 'vitest';
import type { Evaluation } from '../../core/evaluate.ts';
import { totalCfm50, type HomeModel, type LeakageByLocation } from '../../core/home-model.ts';
import type { Aim2Box } from '../../core/plan/best-package/aim2-box.ts';
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
 * Expects a state's flows within the box's ranges and each step's fall within D_l; each step
 * takes one draw of `next` for its size.
 *
 * @returns the steps checked, how many of their falls had a finite bound and the state's
 *   latent flow (0 on degree days), or null for a
 *   state below the floor (the search never goes there, and the box's shares rely on it)
 */
export function checkStateInBox(
  model: HomeModel,
  box: Aim2Box,
  lower: Readonly<LeakageByLocation>,
  state: LeakageByLocation,
  next: () => number,
): { checked: number; finite: number; latentCfm: number } | null {
  const total = totalCfm50(state);
  if (total < model.floorCfm50) return null;
  const flow = model.airflow(state);
  // On degree days there is no latent flow of its own and no latent season in the box.
  const latentCfm = flow.coolingLatentCfm ?? 0;
  const seasons = [
    { cfm: flow.heatingCfm, season: box.heating },
    { cfm: flow.coolingCfm, season: box.cooling },
    { cfm: latentCfm, season: box.latent ?? null },
  ];
  for (const { cfm, season } of seasons) {
    if (season === null) {
      expect(cfm).toBe(0);
      continue;
    }
    const tolerance = 1e-9 * (1 + cfm);
    expect(cfm).toBeGreaterThanOrEqual(total * season.flowPerCfm50.lo - tolerance);
    expect(cfm).toBeLessThanOrEqual(total * season.flowPerCfm50.hi + tolerance);
  }
  let checked = 0;
  let finite = 0;
  for (const location of LEAK_LOCATIONS) {
    const room = Math.min(state[location] - lower[location], total - model.floorCfm50);
    if (room <= 0) continue;
    const step = room * next();
    const after = model.airflow({ ...state, [location]: state[location] - step });
    const falls = [
      { fall: flow.heatingCfm - after.heatingCfm, season: box.heating },
      { fall: flow.coolingCfm - after.coolingCfm, season: box.cooling },
      { fall: latentCfm - (after.coolingLatentCfm ?? 0), season: box.latent ?? null },
    ];
    for (const { fall, season } of falls) {
      if (season === null) continue;
      const bound = season.fallPerCfm50[location];
      if (Number.isFinite(bound)) finite += 1;
      expect(fall).toBeLessThanOrEqual(step * bound + 1e-9 * (1 + Math.abs(fall)));
    }
    checked += 1;
  }
  return { checked, finite, latentCfm };
}

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
