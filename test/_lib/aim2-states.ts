/**
 * What the AIM-2 best-package tests draw: a seeded uniform generator, random boxes below a
 * leakage state and states inside them, and an invented weather year that swings by season
 * and by day (not a place's weather), with humid summer hours for the latent load.
 */
import type { LeakageByLocation } from '../../core/home-model.ts';
import { LEAK_LOCATIONS, type LeakLocation } from '../../core/schema.ts';
import type { WeatherYear } from '../../core/weather/hourly-airflow.ts';

/** A seeded uniform [0, 1) generator (an LCG: the constants of Numerical Recipes). */
export function uniformFrom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

/** A random box below a state: each location lowered by up to `depth` of what it holds. */
export function boxBelow(leakage: LeakageByLocation, next: () => number, depth: number) {
  const lower = { ...leakage };
  for (const location of LEAK_LOCATIONS) {
    if (next() < 0.6) lower[location] = leakage[location] * (1 - depth * next());
  }
  return lower;
}

/** A state inside a box. */
export function stateIn(
  lower: LeakageByLocation,
  upper: LeakageByLocation,
  next: () => number,
): Record<LeakLocation, number> {
  const state = { ...upper };
  for (const location of LEAK_LOCATIONS) {
    state[location] = lower[location] + (upper[location] - lower[location]) * next();
  }
  return state;
}

const HOURS = 8760;

/** A year that swings by season and by day (invented for the test, not a place's weather). */
export function swingingYear(): WeatherYear {
  return {
    name: 'Swinging test year',
    elevationFt: 0,
    outdoorF: Float64Array.from(
      { length: HOURS },
      (_, hour) =>
        50 - 28 * Math.cos((2 * Math.PI * hour) / HOURS) + 9 * Math.sin((2 * Math.PI * hour) / 24),
    ),
    windMph: Float64Array.from({ length: HOURS }, (_, hour) => 6 + 4 * Math.sin(hour / 37)),
    humidityRatio: Float64Array.from(
      { length: HOURS },
      (_, hour) => 0.008 - 0.005 * Math.cos((2 * Math.PI * hour) / HOURS),
    ),
  };
}
