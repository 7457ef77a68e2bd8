/**
 * What a refused request's reply must look like: `{ ok: false, error: { kind, message,
 * field?, problems? } }` and nothing else (`problems` only with kind `invalid`: each a
 * `{ path, message }` in plain words), with a message a person can read (no stack, no validator or
 * engine names, no file paths, not an echo of a huge input).
 */

/** The longest message a refusal of one fault may have, characters (echoes are cut at 40). */
export const MAX_MESSAGE_CHARS = 2000;

const INTERNALS: readonly RegExp[] = [
  /\n\s*at\s/, // a stack frame
  /\bat .+:\d+:\d+/, // a stack frame's file:line:column
  /\b(Zod|Sqlite|Type|Range|Reference|Syntax)Error\b/,
  /\bError:/,
  /node_modules|\/work\/|\.ts\b|\.js\b/,
  /\[object \w+\]/,
  /"code":/, // a serialized validator issue
];

/**
 * Whether a message reads as plain words.
 *
 * @param message - the reply's message
 * @returns the problems found (empty when it reads well)
 */
export function messageProblems(message: unknown): string[] {
  if (typeof message !== 'string') return [`message is ${typeof message}, not text`];
  const problems: string[] = [];
  if (message.trim() === '') problems.push('message is empty');
  if (!/[a-z]{3,}/i.test(message)) problems.push(`message has no words: ${message}`);
  if (message.length > MAX_MESSAGE_CHARS) problems.push(`message is ${message.length} chars`);
  for (const pattern of INTERNALS) {
    if (pattern.test(message)) problems.push(`message shows internals (${pattern}): ${message}`);
  }
  return problems;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * What is wrong with a reply that should refuse a request.
 *
 * @param reply - what callChannel (or the browser host) returned
 * @param expected.kind - the error kind wanted
 * @param expected.field - the field wanted; '' for none, undefined to not check it
 * @returns the problems found (empty when the reply is a proper refusal)
 */
export function refusalProblems(
  reply: unknown,
  expected: { kind: string; field?: string | undefined },
): string[] {
  if (!isRecord(reply)) return ['reply is not an object'];
  const keys = Object.keys(reply).sort().join(',');
  if (keys !== 'error,ok' || reply.ok !== false) return [`reply is ${JSON.stringify(reply)}`];
  const error = reply.error;
  if (!isRecord(error)) return ['error is not an object'];
  const problems: string[] = [];
  const extra = Object.keys(error).filter(
    (key) => !['kind', 'message', 'field', 'problems'].includes(key),
  );
  if (extra.length > 0) problems.push(`error has ${extra.join(', ')}`);
  if ('problems' in error) {
    const list = error.problems;
    if (expected.kind !== 'invalid')
      problems.push('problems listed on a refusal that is not invalid');
    if (!Array.isArray(list) || list.length === 0)
      problems.push('problems is not a list of problems');
    else {
      for (const item of list.slice(0, 20)) {
        if (!isRecord(item) || typeof item.path !== 'string')
          problems.push('a problem has no path');
        else problems.push(...messageProblems(item.message));
      }
    }
  }
  if (error.kind !== expected.kind) problems.push(`kind ${String(error.kind)}`);
  problems.push(...messageProblems(error.message));
  if ('field' in error && (typeof error.field !== 'string' || error.field === '')) {
    problems.push('field is present but not a path');
  }
  if (expected.field !== undefined && (error.field ?? '') !== expected.field) {
    problems.push(`field ${String(error.field)} instead of ${expected.field || '(none)'}`);
  }
  return problems;
}
