/**
 * What every part of the channel table is built with: the shape of a channel, the `channel()`
 * helper that checks a definition's handler against its schemas, and the small schemas the
 * parts share.
 */
import { z } from 'zod';
import type { Store } from '../../db/store.ts';

/** What a handler works with. */
export interface ChannelContext {
  store: Store;
}

/** One channel: its request schema, its response schema and its handler. */
export interface Channel<Request extends z.ZodType, Response extends z.ZodType> {
  request: Request;
  response: Response;
  handle(context: ChannelContext, request: z.output<Request>): z.input<Response>;
}

/**
 * A channel definition as given, typed so that the handler takes the parsed request and
 * returns what the response schema accepts.
 *
 * @param definition - the request schema, the response schema and the handler
 * @returns the same definition
 */
export function channel<Request extends z.ZodType, Response extends z.ZodType>(
  definition: Channel<Request, Response>,
): Channel<Request, Response> {
  return definition;
}

export const id = z.int().positive();
export const byId = z.strictObject({ id });
export const nothing = z.strictObject({});
export const done = z.strictObject({ done: z.literal(true) });
export const DONE = { done: true } as const;

/**
 * A record of the store's own type. The store builds these from validated rows, so the reply
 * checks only that an object came back; the type travels to the screens through `ChannelResponse`.
 */
export function recordOf<T extends object>() {
  return z.custom<T>(
    (value) => typeof value === 'object' && value !== null && !Array.isArray(value),
    'expected a record',
  );
}
