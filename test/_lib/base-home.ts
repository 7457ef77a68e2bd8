/**
 * A valid home file to break one field at a time, and small helpers that reach into a plain
 * JSON object by the dotted paths the home-file errors use (`measures[1].byUnits.units`).
 *
 * The house is invented for the tests: a one-and-a-half-storey house with a basement, a gas
 * furnace, central cooling and three measures, one of each estimate kind.
 */
import type { HomeFileInput } from '../../core/schema.ts';

/** A JSON value, as a home file read from disk holds. */
export type JsonValue =
  null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

/** A JSON object. */
export type JsonObject = { [key: string]: JsonValue };

/**
 * The valid base home.
 *
 * @returns a fresh copy as plain JSON (every call returns a new object)
 */
export function validBaseHome(): JsonObject {
  const home: HomeFileInput = {
    format: 'sealwork-home/1',
    name: 'Bad-input base house',
    house: {
      conditionedFloorAreaFt2: 1600,
      conditionedVolumeFt3: 13_600,
      stories: 1.5,
      heightFt: 14,
      bedrooms: 3,
      shelterClass: 3,
      foundation: 'basement',
      yearBuilt: 1955,
      knobAndTubeWiring: false,
    },
    climate: {
      name: 'Test climate',
      hdd65F: 5500,
      cdd65F: 900,
      elevationFt: 600,
      nFactorZone: 2,
      wsf: 0.55,
      heatingSeason: { meanDeltaTF: 32, meanWindSpeedMph: 8.5 },
      coolingSeason: { meanDeltaTF: 9, meanWindSpeedMph: 6.5 },
    },
    heating: {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.8,
      distributionEfficiency: 0.85,
    },
    cooling: { seer: 14 },
    prices: {
      naturalGas: { usdPerUnit: 1.25, escalationRateReal: 0.01 },
      electricity: { usdPerUnit: 0.16 },
    },
    economics: { discountRateReal: 0.03, ranking: 'sir' },
    infiltrationMethod: 'nFactor',
    leakageTest: { cfm50: 3200 },
    combustionAppliances: [{ kind: 'waterHeater', fuel: 'naturalGas', venting: 'naturalDraft' }],
    ventilation: { existingFanCfm: 20, fanType: 'exhaust' },
    measures: [
      {
        id: 'm1',
        type: 'attic-top-plates',
        reductionCfm50: { low: 150, likely: 250, high: 400 },
        cost: { materialsUsd: 90, laborHours: 5, laborRateUsdPerHour: 50, markupFraction: 0.1 },
        lifeYears: 20,
      },
      {
        id: 'm2',
        type: 'recessed-lights',
        byUnits: { units: 6, sealingEffectiveness: { low: 0.6, likely: 0.8, high: 0.9 } },
        cost: { materialsUsd: 60, laborHours: 3, laborRateUsdPerHour: 50 },
      },
      {
        id: 'm3',
        type: 'rim-joist',
        shareOfLocation: { share: { low: 0.1, likely: 0.2, high: 0.3 } },
        cost: { materialsUsd: 70, laborHours: 4, laborRateUsdPerHour: 50 },
        status: 'planned',
      },
    ],
  };
  return JSON.parse(JSON.stringify(home)) as JsonObject;
}

/** `measures[1].byUnits` → `['measures', 1, 'byUnits']`. */
function keysOf(path: string): (string | number)[] {
  const keys: (string | number)[] = [];
  for (const part of path.split('.')) {
    const match = /^([^[\]]+)((?:\[\d+\])*)$/.exec(part);
    if (!match) throw new Error(`bad test path "${path}"`);
    keys.push(match[1] ?? '');
    for (const index of (match[2] ?? '').matchAll(/\[(\d+)\]/g)) keys.push(Number(index[1]));
  }
  return keys;
}

/** The object or list that holds the last key of `path`, and that key. */
function parentOf(root: JsonObject, path: string): { parent: JsonValue; key: string | number } {
  const keys = keysOf(path);
  const key = keys.pop();
  if (key === undefined) throw new Error(`empty test path`);
  let node: JsonValue = root;
  for (const step of keys) {
    if (node === null || typeof node !== 'object') throw new Error(`no "${step}" in ${path}`);
    const next: JsonValue | undefined = Array.isArray(node)
      ? node[step as number]
      : node[String(step)];
    if (next === undefined) throw new Error(`no "${step}" in ${path}`);
    node = next;
  }
  return { parent: node, key };
}

/**
 * Sets the value at a dotted path; the parent must exist.
 *
 * @param root - the home file to change in place
 * @param path - e.g. `measures[0].cost.laborHours`
 * @param value - the new value
 */
export function setAt(root: JsonObject, path: string, value: JsonValue): void {
  const { parent, key } = parentOf(root, path);
  if (Array.isArray(parent) && typeof key === 'number') parent[key] = value;
  else if (parent !== null && typeof parent === 'object' && !Array.isArray(parent))
    parent[String(key)] = value;
  else throw new Error(`cannot set ${path}`);
}

/**
 * Removes the field at a dotted path; it must be there, so a typo in a test fails loudly.
 *
 * @param root - the home file to change in place
 * @param path - e.g. `climate.nFactorZone`
 */
export function deleteAt(root: JsonObject, path: string): void {
  const { parent, key } = parentOf(root, path);
  if (parent === null || typeof parent !== 'object' || Array.isArray(parent)) {
    throw new Error(`cannot delete ${path}`);
  }
  if (!(String(key) in parent)) throw new Error(`nothing at ${path}`);
  delete parent[String(key)];
}

/**
 * Freezes an object and everything inside it, so any write by the code under test throws.
 *
 * @param value - the object to freeze
 * @returns the same object, frozen
 */
export function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object') {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}
