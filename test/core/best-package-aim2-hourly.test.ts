/**
 * The AIM-2 bound on homes planned hour by hour (core/plan/best-package/aim2-hourly-bins.ts,
 * aim2-box.ts with bins of hours, aim2-steps.ts with the latent load's own flow), each
 * condition checked against the model's own hourly airflow and energy (model.airflow,
 * model.energyOf, which sum every hour: core/weather/aim2-hourly.ts) at states drawn inside
 * the boxes, and by finite differences: an independent computation, not the bound's. The
 * search itself is held to brute force in best-package-aim2.test.ts and below on homes with
 * more measures.
 */
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { totalCfm50 } from '../../core/home-model.ts';
import { aim2BoxBounds } from '../../core/plan/best-package/aim2-box.ts';
import { hourlyDrivers } from '../../core/plan/best-package/aim2-hourly-bins.ts';
import { parseHomeFile, type HomeFileInput } from '../../core/schema.ts';
import type { WeatherYear } from '../../core/weather/hourly-airflow.ts';
import { hourlyAim2Pressures } from '../../core/weather/hourly-airflow.ts';
import { hourlyBasisOf } from '../../core/weather/hourly-climate.ts';
import { boxBelow, stateIn, swingingYear, uniformFrom } from '../_lib/aim2-states.ts';
import { everyPackage } from '../_lib/package-brute-force.ts';
import { expectBruteForceBest } from '../_lib/expect-brute-force.ts';
import { checkStateInBox, checkStepDollars } from '../_lib/aim2-box-checks.ts';
import { generatedPackageHomes, packageQueriesFor } from '../_lib/package-cases.ts';

const SEED = 20261204;

/**
 * The swinging year with calm hours (every 11th: stack alone) and hours at the home's indoor
 * cooling temperature (every 17th: wind alone), so the single-driver sums are in play.
 */
function yearFor(home: HomeFileInput): WeatherYear {
  const year = swingingYear();
  const indoorCoolingF = hourlyBasisOf(parseHomeFile(home)).indoorCoolingF;
  const windMph = Float64Array.from(year.windMph, (mph, hour) => (hour % 11 === 0 ? 0 : mph));
  const outdoorF = Float64Array.from(year.outdoorF, (degrees, hour) =>
    hour % 17 === 0 ? indoorCoolingF : degrees,
  );
  return { ...year, windMph, outdoorF };
}

/** Generated AIM-2 homes planned hour by hour on their year, evaluated. */
function hourlyHomes(count: number, seed: number, most: number) {
  return generatedPackageHomes({ count, seed, most, methods: ['aim2'] }).map((entry) => {
    const weather = yearFor(entry.home);
    return {
      ...entry,
      weather,
      evaluation: evaluateHome({ ...entry.home, hourlyWeather: {} }, { weather }),
    };
  });
}

describe('the bins of hours', () => {
  it('carry every hour with both drivers once, at its weight × P_sⁿ, with its P_w/P_s in range', () => {
    let checked = 0;
    let stackOnly = 0;
    let windOnly = 0;
    for (const { evaluation, weather } of hourlyHomes(6, SEED, 4)) {
      const { model } = evaluation;
      const year = { ...weather, elevationFt: evaluation.home.climate.elevationFt };
      const seasons = hourlyAim2Pressures(
        evaluation.home,
        model.exponentN,
        year,
        hourlyBasisOf(evaluation.home),
      );
      for (const season of [seasons.heating, seasons.cooling]) {
        if (season === null) continue;
        for (const which of ['sensible', 'latent'] as const) {
          const drivers = hourlyDrivers(season, model.exponentN, which, 5);
          const total = which === 'sensible' ? season.totalWeight : season.totalLatentWeight;
          if (drivers === null) {
            expect(total).toBe(0);
            continue;
          }
          const weights = which === 'sensible' ? season.weight : season.latentWeight;
          // Σ w·P_sⁿ over the groups, summed here straight from the groups.
          let expected = 0;
          for (let group = 0; group < season.count; group += 1) {
            expected +=
              ((weights[group] ?? 0) * (season.stackPa[group] ?? 0) ** model.exponentN) / total;
          }
          if (drivers.stackOnly > 0) stackOnly += 1;
          if (drivers.windOnly > 0) windOnly += 1;
          const binned = drivers.bins.reduce((sum, bin) => sum + bin.weight, 0);
          expect(binned).toBeCloseTo(expected, 12);
          expect(drivers.bins.length).toBeLessThanOrEqual(5);
          for (let group = 0; group < season.count; group += 1) {
            if (!((weights[group] ?? 0) > 0)) continue;
            const ratio = (season.windPa[group] ?? 0) / (season.stackPa[group] ?? 1);
            expect(
              drivers.bins.some((bin) => bin.windPa.lo <= ratio && ratio <= bin.windPa.hi),
            ).toBe(true);
            checked += 1;
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(1000);
    expect(stackOnly).toBeGreaterThan(0);
    expect(windOnly).toBeGreaterThan(0);
  });
});

describe('the AIM-2 box bounds hour by hour', () => {
  const homes = hourlyHomes(40, SEED + 1, 8);

  it('hold the hourly flow per CFM50 (heating, cooling, latent) and its fall per CFM50', () => {
    const next = uniformFrom(SEED + 2);
    let checked = 0;
    let finite = 0;
    let latentSeen = 0;
    for (const { evaluation } of homes) {
      const { model } = evaluation;
      const bounds = aim2BoxBounds(model);
      for (let draw = 0; draw < 6; draw += 1) {
        const upper = model.testIn;
        const lower = boxBelow(upper, next, draw < 3 ? 0.1 : 0.6);
        const box = bounds({ lower, upper, floorCfm50: model.floorCfm50 });
        if (draw === 0) {
          // At a point, with a bin for each group of hours, the bounds close in on the flow
          // itself: every hour's term counted once.
          const point = aim2BoxBounds(
            model,
            Number.MAX_SAFE_INTEGER,
          )({
            lower: upper,
            upper,
            floorCfm50: 0,
          });
          expect(point).not.toBeNull();
          const flow = model.airflow(upper);
          const total = totalCfm50(upper);
          const pairs = [
            { cfm: flow.heatingCfm, season: point?.heating ?? null },
            { cfm: flow.coolingCfm, season: point?.cooling ?? null },
            { cfm: flow.coolingLatentCfm ?? 0, season: point?.latent ?? null },
          ];
          for (const { cfm, season } of pairs) {
            if (season === null) continue;
            expect(total * season.flowPerCfm50.hi).toBeGreaterThanOrEqual(cfm * (1 - 1e-9));
            expect(total * season.flowPerCfm50.hi).toBeLessThanOrEqual(cfm * (1 + 1e-6) + 1e-9);
          }
        }
        if (box === null) continue;
        for (let sample = 0; sample < 4; sample += 1) {
          const state = stateIn(lower, upper, next);
          const result = checkStateInBox(model, box, lower, state, next);
          if (result === null) continue;
          if (result.latentCfm > 0) latentSeen += 1;
          checked += result.checked;
          finite += result.finite;
        }
      }
    }
    expect(checked).toBeGreaterThan(500);
    expect(finite).toBeGreaterThan(checked);
    expect(latentSeen).toBeGreaterThan(0);
  });

  it('bound what a step saves in heating and electricity dollars, latent load and fan in', () => {
    const next = uniformFrom(SEED + 3);
    let checked = 0;
    for (const { evaluation } of homes) checked += checkStepDollars(evaluation, next).checked;
    expect(checked).toBeGreaterThan(300);
  });
});

describe('best package hour by hour on AIM-2 homes of up to 12 measures: equals brute force', () => {
  it('four queries each, and the bound cuts', () => {
    let compared = 0;
    let cut = 0;
    for (const { evaluation, budgetFraction, kind } of hourlyHomes(40, SEED + 4, 12)) {
      const packages = everyPackage(evaluation);
      for (const query of packageQueriesFor(evaluation, budgetFraction, kind)) {
        const label = evaluation.home.name;
        const found = expectBruteForceBest(evaluation, packages, query, label);
        expect(found.boundsUsed, `${label}, ${JSON.stringify(query)}`).toBe(true);
        if (found.nodesVisited < packages.length) cut += 1;
        compared += 1;
      }
    }
    expect(compared).toBe(4 * 40);
    expect(cut).toBeGreaterThan(40);
  }, 300_000);
});
