/**
 * Words the screens show for the store's codes: fuels and job states as people say them.
 * A code the table does not know (a newer file) is shown as stored rather than hidden.
 */
import type { Fuel } from '../core/schema.ts';
import type { ChannelResponse } from '../electron/channels.ts';

type JobStatus = ChannelResponse<'homes.list'>[number]['jobStatus'];

const FUEL_WORDS: Readonly<Record<Fuel, string>> = {
  naturalGas: 'Natural gas',
  propane: 'Propane',
  heatingOil: 'Heating oil',
  kerosene: 'Kerosene',
  electricity: 'Electric',
  wood: 'Wood',
  pellets: 'Pellets',
};

// The same words as core/job-status.ts JOB_STATUS_LABELS (the work order prints those); that
// module brings zod, which the page's Content Security Policy keeps out, so they are kept here.
const JOB_WORDS: Readonly<Record<JobStatus, string>> = {
  audited: 'Audited',
  scoped: 'Scoped',
  approved: 'Approved',
  inProgress: 'In progress',
  testedOut: 'Tested out',
  closed: 'Closed',
  onHold: 'On hold',
  declined: 'Declined',
};

function isFuel(code: string): code is Fuel {
  return Object.hasOwn(FUEL_WORDS, code);
}

/** The heating fuel in words, or a dash when the home has none recorded. */
export function fuelWords(code: string | null): string {
  if (code === null) return '—';
  return isFuel(code) ? FUEL_WORDS[code] : code;
}

/** A job's state in words; a status the table does not know (a newer file's) as stored. */
export function jobWords(status: string): string {
  return Object.hasOwn(JOB_WORDS, status) ? JOB_WORDS[status as JobStatus] : status;
}

/** "1 home", "16 homes". */
export function homesCountWords(count: number): string {
  return count === 1 ? '1 home' : `${count} homes`;
}

/**
 * A home's name as a short title and the description after its first ": ", so a list shows
 * "14 Millrace Lane" boldly with the house's description below it; null when there is none.
 */
export function nameParts(name: string): { title: string; detail: string | null } {
  const at = name.indexOf(': ');
  if (at <= 0 || at + 2 >= name.length) return { title: name, detail: null };
  return { title: name.slice(0, at), detail: name.slice(at + 2) };
}

const DATE_FORMAT = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' });

/** A stored calendar date (`YYYY-MM-DD`) as people read it: "Jan 13, 2026". */
export function dateWords(isoDate: string | undefined): string {
  return isoDate === undefined ? 'No date' : DATE_FORMAT.format(new Date(`${isoDate}T00:00:00Z`));
}

const RANKING_WORDS: Readonly<Record<string, string>> = {
  sir: 'savings-to-investment ratio (SIR), highest first',
  npv: 'net present value (NPV), highest first',
  payback: 'simple payback, shortest first',
  cce: 'cost of conserved energy, lowest first',
};

/** The criterion a plan's measures are ranked by, in words; an unknown code as stored. */
export function rankingWords(code: string): string {
  return RANKING_WORDS[code] ?? code;
}

const SEVERITY_WORDS: Readonly<Record<string, string>> = {
  danger: 'Danger',
  warning: 'Warning',
  notice: 'Notice',
};

/** A caution's severity as a word; an unknown code as stored. */
export function severityWords(code: string): string {
  return SEVERITY_WORDS[code] ?? code;
}

const MEASURE_STATUS_WORDS: Readonly<Record<string, string>> = {
  planned: 'Planned',
  done: 'Done',
  declined: 'Declined',
};

/** A measure's state in words; a measure with none stored is planned. */
export function measureStatusWords(code: string | undefined): string {
  return MEASURE_STATUS_WORDS[code ?? 'planned'] ?? code ?? 'Planned';
}

const MEASURE_GROUP_WORDS: Readonly<Record<string, string>> = {
  atticBypass: 'Attic bypasses',
  rimAndSill: 'Rim joists and sills',
  penetration: 'Penetrations',
  doorsAndWindows: 'Doors and windows',
  other: 'Other work',
};

/** A group of the measure library in words; an unknown code as stored. */
export function measureGroupWords(code: string): string {
  return MEASURE_GROUP_WORDS[code] ?? code;
}

const LOCATION_WORDS: Readonly<Record<string, string>> = {
  ceiling: 'Ceiling',
  wall: 'Walls',
  floor: 'Floor',
  flue: 'Flue',
};

/** Where a leak is, in words; an unknown code as stored. */
export function locationWords(code: string | undefined): string {
  if (code === undefined) return '—';
  return LOCATION_WORDS[code] ?? code;
}

const MEASURE_UNIT_WORDS: Readonly<Record<string, string>> = {
  each: 'each',
  linearFt: 'ft',
  ft2: 'ft²',
  job: 'job',
};

/** The unit a library type is counted in, as a short word ("ft", "each"). */
export function measureUnitWords(code: string): string {
  return MEASURE_UNIT_WORDS[code] ?? code;
}
