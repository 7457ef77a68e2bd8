/**
 * The choices of the Homes list's filters and sort, in words: job states (the six stages, then
 * on hold and declined), leakiness bands (with where their limits come from), what the list can
 * be ordered by and the two directions of each.
 * The store decides which home is in which band (db/repositories/homes.ts); these are its words.
 */
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import { jobWords } from '../labels.ts';

type HomeSummary = ChannelResponse<'homes.list'>[number];
export type JobStatus = HomeSummary['jobStatus'];
export type LeakinessBand = HomeSummary['leakiness'];
export type HomeSort = NonNullable<ChannelRequest<'homes.list'>['sort']>;

export interface Choice<Value extends string> {
  value: Value;
  words: string;
}

// Records keyed by the store's types, so a state, band or sort added there and not here fails
// to compile. The screens cannot import the store's lists themselves (zod would come along).
// The six stages in the order the work goes, then the two states that stop a job; `true` for a
// stage (a new home may start at one), as core/job-status.ts JOB_STAGES and JOB_STATUSES.
const JOB_STATUSES: Readonly<Record<JobStatus, boolean>> = {
  audited: true,
  scoped: true,
  approved: true,
  inProgress: true,
  testedOut: true,
  closed: true,
  onHold: false,
  declined: false,
};

/** Every job state, in the order the work goes, on hold and declined last. */
export const JOB_STATUS_CHOICES: readonly Choice<JobStatus>[] = (
  Object.keys(JOB_STATUSES) as JobStatus[]
).map((value) => ({ value, words: jobWords(value) }));

/** The six stages only: what a new home may start at (on hold and declined need a reason). */
export const JOB_STAGE_CHOICES: readonly Choice<JobStatus>[] = JOB_STATUS_CHOICES.filter(
  (choice) => JOB_STATUSES[choice.value],
);

/** The bands' words, their ACH50 limits as the store sets them (LEAKINESS_LOWER_ACH50). */
const LEAKINESS_WORDS: Readonly<Record<LeakinessBand, string>> = {
  tight: 'Tight: under 3 ACH50',
  moderate: 'Moderate: 3 to under 7 ACH50',
  leaky: 'Leaky: 7 to under 15 ACH50',
  veryLeaky: 'Very leaky: 15 ACH50 or more',
  unknown: 'Not known: no test-in or no volume yet',
};

export const LEAKINESS_CHOICES: readonly Choice<LeakinessBand>[] = choicesOf(LEAKINESS_WORDS);

/** Where the band limits come from, shown under the leakiness filter. */
export const LEAKINESS_SOURCE =
  'ACH50 of the plan’s test-in. 3 is the IECC’s limit for new homes in most climates (2012 on), 7 the 2009 IECC’s (both from memory); 15 and over is very leaky by common practice.';

/** A band's short name for the list ("Leaky"), or a dash when it is not known. */
export function leakinessWords(band: LeakinessBand): string {
  if (band === 'unknown') return 'not known';
  return LEAKINESS_WORDS[band].split(':')[0] ?? band;
}

interface SortWords {
  words: string;
  /** The two directions in words: ascending, then descending. */
  up: string;
  down: string;
  /** Whether the direction a person most often wants is descending. */
  downFirst: boolean;
}

const SORT_WORDS: Readonly<Record<HomeSort, SortWords>> = {
  name: { words: 'Name', up: 'A to Z', down: 'Z to A', downFirst: false },
  town: { words: 'Town', up: 'A to Z', down: 'Z to A', downFirst: false },
  yearBuilt: { words: 'Year built', up: 'Oldest first', down: 'Newest first', downFirst: false },
  floorArea: { words: 'Floor area', up: 'Smallest first', down: 'Largest first', downFirst: false },
  leakiness: {
    words: 'Leakiness (ACH50)',
    up: 'Tightest first',
    down: 'Leakiest first',
    downFirst: true,
  },
  measures: { words: 'Measures', up: 'Fewest first', down: 'Most first', downFirst: true },
  updated: {
    words: 'Last changed',
    up: 'Longest ago first',
    down: 'Latest first',
    downFirst: true,
  },
};

export const SORT_CHOICES: readonly Choice<HomeSort>[] = (
  Object.keys(SORT_WORDS) as HomeSort[]
).map((value) => ({ value, words: SORT_WORDS[value].words }));

/** The two directions of a sort, in words, ascending first. */
export function orderChoices(sort: HomeSort): readonly Choice<'up' | 'down'>[] {
  const words = SORT_WORDS[sort];
  return [
    { value: 'up', words: words.up },
    { value: 'down', words: words.down },
  ];
}

/** The direction a sort starts in when it is chosen. */
export function startsDescending(sort: HomeSort): boolean {
  return SORT_WORDS[sort].downFirst;
}

/** "by leakiness (ACH50), leakiest first"; "by name, A to Z". */
export function sortWords(sort: HomeSort, descending: boolean): string {
  const words = SORT_WORDS[sort];
  const direction = descending ? words.down : words.up;
  // Letters named as letters (A to Z) keep their capitals; a word at the start loses its own.
  const lowered = /^[A-Z] to [A-Z]$/.test(direction)
    ? direction
    : direction.charAt(0).toLowerCase() + direction.slice(1);
  const key = words.words.charAt(0).toLowerCase() + words.words.slice(1);
  return `by ${key}, ${lowered}`;
}

export function isJobStatus(text: string): text is JobStatus {
  return Object.hasOwn(JOB_STATUSES, text);
}

export function isLeakinessBand(text: string): text is LeakinessBand {
  return Object.hasOwn(LEAKINESS_WORDS, text);
}

export function isHomeSort(text: string): text is HomeSort {
  return Object.hasOwn(SORT_WORDS, text);
}

function choicesOf<Value extends string>(words: Readonly<Record<Value, string>>): Choice<Value>[] {
  return (Object.keys(words) as Value[]).map((value) => ({ value, words: words[value] }));
}
