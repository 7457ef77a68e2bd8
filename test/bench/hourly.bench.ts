/**
 * How fast a plan runs hour by hour: a 20-measure home planned on a full year of hourly
 * weather (8,760 hours), once with the LBL basic model and once with the enhanced model
 * (AIM-2), after warm-up; target under 50 ms a plan. Beside it, the same home on degree
 * days, and the ratio. Prints figures; asserts nothing. Run with `tsx test/bench/hourly.bench.ts`.
 *
 * The weather is the shared Greensboro TMY3 year when ../shared/data/weather is beside the
 * project, else a generated year (a cosine through the seasons and the day).
 */
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { evaluateHome } from '../../core/evaluate.ts';
import type { HomeFileInput, InfiltrationMethod } from '../../core/schema.ts';
import { climateFromWeather, detectAndParseWeather, weatherYearOf } from '../../core/weather.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { tmy3Year } from '../_lib/weather-files.ts';
import { median, withLibraryMeasures } from './_lib/bench-homes.ts';

const TARGET_MS = 50;
const RUNS = 15;
const MEASURES = 20;

const SHARED_TMY3 = fileURLToPath(
  new URL('../../../shared/data/weather/723170TYA.CSV', import.meta.url),
);

function weatherText(): { text: string; from: string } {
  if (existsSync(SHARED_TMY3)) {
    return { text: readFileSync(SHARED_TMY3, 'utf8'), from: 'Greensboro TMY3 (shared data)' };
  }
  const text = tmy3Year((day) => 12 - 14 * Math.cos((2 * Math.PI * (day - 15)) / 365));
  return { text, from: 'a generated year (no shared weather folder here)' };
}

function twentyMeasureHome(home: HomeFileInput, method: InfiltrationMethod): HomeFileInput {
  return { ...home, infiltrationMethod: method, measures: withLibraryMeasures(home, MEASURES) };
}

function timed(run: () => unknown): { medianMs: number; firstMs: number } {
  const samples: number[] = [];
  for (let index = 0; index < RUNS; index++) {
    const started = performance.now();
    run();
    samples.push(performance.now() - started);
  }
  return { medianMs: median(samples), firstMs: samples[0] ?? Number.NaN };
}

const { text, from } = weatherText();
const weather = detectAndParseWeather(text);
const year = weatherYearOf(weather);
const climate = climateFromWeather(weather);
console.log(
  `A year hour by hour (${year.outdoorF.length.toLocaleString('en-US')} hours, ${from}), ` +
    `a ${MEASURES}-measure home, median of ${RUNS} plans:`,
);
const base = DEMO_HOMES.find((home) => home.cooling) ?? DEMO_HOMES[0];
if (!base) throw new Error('no demo home to bench');
for (const method of ['lblBasic', 'aim2'] as const) {
  const degreeDayHome = twentyMeasureHome({ ...base, climate }, method);
  const hourlyHome = { ...degreeDayHome, hourlyWeather: {} };
  const hourly = timed(() => evaluateHome(hourlyHome, { weather: year }));
  const degreeDays = timed(() => evaluateHome(degreeDayHome));
  const included = evaluateHome(hourlyHome, { weather: year }).plan.entries.filter(
    (entry) => entry.included,
  ).length;
  console.log(
    `  ${method.padEnd(8)} ${included} of ${MEASURES} measures in the package: ` +
      `${hourly.medianMs.toFixed(1)} ms (first ${hourly.firstMs.toFixed(1)} ms); ` +
      `target < ${TARGET_MS} ms; ratio ${(hourly.medianMs / TARGET_MS).toFixed(2)} of target; ` +
      `on degree days ${degreeDays.medianMs.toFixed(1)} ms ` +
      `(hour by hour takes ${(hourly.medianMs / degreeDays.medianMs).toFixed(1)} times as long)`,
  );
}
