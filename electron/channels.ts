/**
 * The channel table: every operation the screens (and the command line) may ask of the core
 * and the project file, each a name with a zod request schema, a zod response schema and a
 * handler. The hosts (the desktop main process, the browser host, the command line) all call
 * `callChannel`, so they cannot drift apart. Handlers never trust their input: a request
 * that does not parse is refused before anything is read or written.
 *
 * The definitions live by area in channels/ (homes, tests and measures, plans and library,
 * clients and stored sets and settings, files and portfolio, bills), each built with `channel()`
 * from channels/_define.ts; this file puts them together, calls them and words their errors.
 */
import type { z } from 'zod';
import { InputError } from '../core/errors.ts';
import { problemsFromZod } from '../core/_lib/zod-problems.ts';
import { DbError } from '../db/errors.ts';
import type { ChannelNameList } from './channel-names.ts';
import type { Channel, ChannelContext } from './channels/_define.ts';
import { billChannels } from './channels/bills.ts';
import { choiceChannels } from './channels/choices.ts';
import { clientSetAndSettingChannels } from './channels/clients-sets-and-settings.ts';
import { fileAndPortfolioChannels } from './channels/files-and-portfolio.ts';
import { homeChannels } from './channels/homes.ts';
import { jobChannels } from './channels/jobs.ts';
import { planAndLibraryChannels } from './channels/plans-and-library.ts';
import { testAndMeasureChannels } from './channels/tests-and-measures.ts';

export type { ChannelContext } from './channels/_define.ts';

/** Every channel by name; the parts are spread in the order of CHANNEL_NAMES (channel-names.ts). */
export const channels = {
  ...homeChannels,
  ...testAndMeasureChannels,
  ...planAndLibraryChannels,
  ...choiceChannels,
  ...clientSetAndSettingChannels,
  ...fileAndPortfolioChannels,
  ...billChannels,
  ...jobChannels,
} as const;

export type Channels = typeof channels;
export type ChannelName = keyof Channels;
export type ChannelRequest<Name extends ChannelName> = z.input<Channels[Name]['request']>;
export type ChannelResponse<Name extends ChannelName> = z.output<Channels[Name]['response']>;

export interface ChannelError {
  /** `invalid` for a request or input that does not parse; otherwise a DbError kind or `unexpected`. */
  kind: string;
  message: string;
  field?: string;
  /** With `invalid`: every problem (up to 500) with its field, to show beside the fields. */
  problems?: { path: string; message: string }[];
}

export type Reply<Value> = { ok: true; value: Value } | { ok: false; error: ChannelError };

/** Whether `name` is a channel of the table (for hosts that receive names from outside). */
export function isChannelName(name: string): name is ChannelName {
  return Object.hasOwn(channels, name);
}

/** How many problems the message of a reply spells out; the rest are counted. */
const MAX_PROBLEMS_IN_MESSAGE = 10;
/** How many problems a reply lists, each with its field, for a caller to show beside the fields. */
const MAX_PROBLEMS_LISTED = 500;

/** The reply for an error thrown by a handler: only the kind, a plain message and the field. */
export function replyForError(error: unknown): { ok: false; error: ChannelError } {
  if (error instanceof InputError) {
    const first = error.problems[0];
    const shown = error.problems
      .slice(0, MAX_PROBLEMS_IN_MESSAGE)
      .map((p) => (p.path ? `${p.path}: ${p.message}` : p.message));
    const more = error.problems.length - shown.length;
    return {
      ok: false,
      error: {
        kind: 'invalid',
        message: [...shown, ...(more > 0 ? [`and ${more} more problems`] : [])].join('\n'),
        ...(first?.path ? { field: first.path } : {}),
        problems: error.problems
          .slice(0, MAX_PROBLEMS_LISTED)
          .map((p) => ({ path: p.path, message: p.message })),
      },
    };
  }
  if (error instanceof DbError) {
    return {
      ok: false,
      error: {
        kind: error.kind,
        message: error.message,
        ...(error.field ? { field: error.field } : {}),
      },
    };
  }
  return {
    ok: false,
    error: {
      kind: 'unexpected',
      message: 'Something went wrong inside Sealwork; nothing was saved by this request.',
    },
  };
}

/**
 * Calls one channel with an untrusted request.
 *
 * @returns `{ ok: true, value }`, or `{ ok: false, error }` for a request that does not
 *   parse (nothing is read or written then) or a handler that fails (its write rolls back)
 */
export function callChannel<Name extends ChannelName>(
  context: ChannelContext,
  name: Name,
  request: unknown,
): Reply<ChannelResponse<Name>> {
  const definition = channels[name] as unknown as Channel<z.ZodType, z.ZodType>;
  try {
    const parsed = definition.request.safeParse(request ?? {});
    if (!parsed.success) {
      return replyForError(new InputError(problemsFromZod(parsed.error, request)));
    }
    const value = definition.response.parse(
      definition.handle(context, parsed.data),
    ) as ChannelResponse<Name>;
    return { ok: true, value };
  } catch (error) {
    return replyForError(error);
  }
}

// The preload's list and the table name the same channels, no more and no fewer.
type SameNames<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const NAMES_MATCH: SameNames<ChannelName, ChannelNameList> = true;
void NAMES_MATCH;
