/** The window's size and place, remembered between runs in a small JSON file. */
import { readFileSync, writeFileSync } from 'node:fs';
import { z } from 'zod';

const boundsSchema = z.strictObject({
  x: z.int().optional(),
  y: z.int().optional(),
  width: z.int().min(800).max(10_000),
  height: z.int().min(600).max(10_000),
  maximized: z.boolean().optional(),
});
export type WindowBounds = z.output<typeof boundsSchema>;

export const DEFAULT_BOUNDS: WindowBounds = { width: 1280, height: 800 };

/** The remembered bounds, or the default when the file is missing or not ours. */
export function loadWindowBounds(path: string): WindowBounds {
  try {
    const parsed = boundsSchema.safeParse(JSON.parse(readFileSync(path, 'utf8')));
    return parsed.success ? parsed.data : DEFAULT_BOUNDS;
  } catch {
    return DEFAULT_BOUNDS;
  }
}

export function saveWindowBounds(path: string, bounds: WindowBounds): void {
  const parsed = boundsSchema.safeParse(bounds);
  if (parsed.success) writeFileSync(path, JSON.stringify(parsed.data), 'utf8');
}
