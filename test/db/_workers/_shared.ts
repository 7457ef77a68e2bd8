/**
 * What the crash and concurrency tests share with their child processes: a seeded
 * generator (so a run's schedule of sizes and delays can be replayed), the line protocol a
 * child speaks on stdout, and self-describing home files whose notes declare how many rows
 * the import must have written, so a half-written transaction can be recognised afterwards.
 */
import { writeSync } from 'node:fs';
import { validBaseHome, type JsonObject } from '../../_lib/base-home.ts';

/** A generator of numbers in [0, 1) from a 32-bit seed. */
export interface SeededRandom {
  /** The next number in [0, 1). */
  next(): number;
  /** An integer from `min` to `max`, both included. */
  integer(min: number, max: number): number;
}

/** Multiplier and increment of the 32-bit LCG in Numerical Recipes (Press et al., 2nd ed., §7.1). */
const LCG_MULTIPLIER = 1_664_525;
const LCG_INCREMENT = 1_013_904_223;
const TWO_TO_32 = 4_294_967_296;

/**
 * A linear congruential generator, x ← (a·x + c) mod 2³², seeded.
 *
 * Notes: a = 1664525, c = 1013904223 (the "quick and dirty" generator); plenty for
 * scheduling kills, useless for statistics.
 *
 * References: Press, Teukolsky, Vetterling, Flannery, Numerical Recipes in C, 2nd ed. (1992), §7.1.
 *
 * @param seed - any integer; only its low 32 bits are used
 * @returns the generator
 */
export function seededRandom(seed: number): SeededRandom {
  let state = seed >>> 0;
  const next = () => {
    state = (Math.imul(state, LCG_MULTIPLIER) + LCG_INCREMENT) >>> 0;
    return state / TWO_TO_32;
  };
  return {
    next,
    integer: (min, max) => min + Math.floor(next() * (max - min + 1)),
  };
}

/**
 * Writes one line to stdout at once. `process.stdout.write` may buffer in user space; a line
 * still in a buffer when SIGKILL lands would be lost, and the parent would then miscount.
 *
 * @param line - the line, without its newline
 */
export function say(line: string): void {
  writeSync(1, `${line}\n`);
}

/**
 * Writes one line to stderr at once; any stderr output fails the test that runs the child.
 *
 * @param line - the line, without its newline
 */
export function complain(line: string): void {
  writeSync(2, `${line}\n`);
}

/**
 * Blocks the thread; a child must not yield to the event loop inside a transaction.
 *
 * @param milliseconds - how long, ms (0 or less returns at once)
 */
export function sleepMs(milliseconds: number): void {
  if (milliseconds > 0) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, milliseconds);
}

/** The rows one imported home must have, as its notes declare them. */
export interface DeclaredRows {
  measures: number;
  tests: number;
  points: number;
}

const DECLARATION = /\bmeasures=(\d+) tests=(\d+) points=(\d+)\b/;

/**
 * The row counts a home's notes declare.
 *
 * @param notes - a home's notes as stored
 * @returns the counts, or undefined when the notes declare none
 */
export function declaredRows(notes: string | null): DeclaredRows | undefined {
  const match = notes === null ? null : DECLARATION.exec(notes);
  if (!match) return undefined;
  return { measures: Number(match[1]), tests: Number(match[2]), points: Number(match[3]) };
}

/** Readings of a made-up multipoint test: flow = 400·ΔP^0.65 with a little scatter. */
function testPoints(count: number, random: SeededRandom): { pa: number; cfm: number }[] {
  return Array.from({ length: count }, (_, index) => {
    const pressurePa = 10 + 5 * index;
    const scatter = 0.97 + 0.06 * random.next();
    return { pa: pressurePa, cfm: Math.round(400 * pressurePa ** 0.65 * scatter) };
  });
}

/** What a generated home file holds. */
export interface HomeFileSpec {
  /** The home's name (the transaction's marker). */
  name: string;
  /** Text put before the declaration in the notes (a batch marker). */
  marker: string;
  measures: number;
  /** Points of the multipoint test-in (2 to 50). */
  testInPoints: number;
  /** Points of each test-out after the work (each 2 to 50). */
  testOutPoints: readonly number[];
  /** Filler characters in the notes, to make the transaction large. */
  paddingChars: number;
}

/**
 * A valid home file whose notes declare the rows its import writes.
 *
 * @param spec - counts and markers
 * @param random - the generator for the readings
 * @returns the file as plain JSON
 */
export function declaringHomeFile(spec: HomeFileSpec, random: SeededRandom): JsonObject {
  const home = validBaseHome();
  const points = spec.testInPoints + spec.testOutPoints.reduce((sum, count) => sum + count, 0);
  const declaration = `measures=${spec.measures} tests=${1 + spec.testOutPoints.length} points=${points}`;
  home.name = spec.name;
  home.notes = `${spec.marker} ${declaration} ${'x'.repeat(spec.paddingChars)}`;
  home.leakageTest = { points: testPoints(spec.testInPoints, random) };
  home.otherLeakageTests = spec.testOutPoints.map((count) => ({
    kind: 'testOut',
    points: testPoints(count, random),
  }));
  home.measures = Array.from({ length: spec.measures }, (_, index) => ({
    id: `m${index + 1}`,
    type: index % 2 === 0 ? 'attic-top-plates' : 'rim-joist',
    reductionCfm50: { low: 10, likely: 20 + (index % 7), high: 40 },
    cost: { materialsUsd: 25 + index, laborHours: 1, laborRateUsdPerHour: 55 },
  }));
  return home;
}

/**
 * The value of `--name value` in argv, or the fallback.
 *
 * @param name - the option without its dashes
 * @param fallback - the value when the option is absent; without one, absence throws
 * @returns the option's text
 */
export function option(name: string, fallback?: string): string {
  const index = process.argv.indexOf(`--${name}`);
  const value = index === -1 ? undefined : process.argv[index + 1];
  if (value !== undefined) return value;
  if (fallback !== undefined) return fallback;
  throw new Error(`missing --${name}`);
}
