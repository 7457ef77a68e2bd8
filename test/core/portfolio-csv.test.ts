/**
 * The Portfolio's CSV (ui/portfolio-csv.ts) read back by papaparse, a general-purpose CSV
 * reader following RFC 4180: quotes, commas and line breaks inside fields survive, and each
 * row holds the figures it was written from.
 */
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvField, csvText } from '../../core/portfolio-csv.ts';

describe('portfolio CSV', () => {
  it('quotes only what must be quoted (RFC 4180, section 2)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a, b')).toBe('"a, b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField(null)).toBe('');
    expect(csvField(Number.NaN)).toBe('');
    expect(csvField(12.5)).toBe('12.5');
  });

  it('reads back as written', () => {
    const rows = [
      [1, '12 Elm St, upstairs', 'naturalGas', 1234.56, null, true],
      [2, 'The "blue" house\non the corner', 'propane', 0, 1.25, false],
    ] as const;
    const text = csvText(['id', 'name', 'fuel', 'costUsd', 'sir', 'done'], rows);
    const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.slice(1)).toEqual(
      rows.map((row) => row.map((cell) => (cell === null ? '' : String(cell)))),
    );
    expect(text.endsWith('\r\n')).toBe(true);
  });
});
