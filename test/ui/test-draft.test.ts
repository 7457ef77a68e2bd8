/**
 * The Leak test form's check of what was typed. The L/s factor follows from the exact foot of
 * NIST SP 811 (2008), appendix B (1 ft = 0.3048 m): 1 ft³/min = 0.3048³ × 1000 / 60 L/s
 * ≈ 0.4719474 L/s, the figure the appendix prints.
 */
import { describe, expect, it } from 'vitest';
import { checkDraft, type ReadingRow } from '../../ui/test-draft.ts';

const rows = (pairs: [string, string][]): ReadingRow[] =>
  pairs.map(([pressurePa, flow], key) => ({ key, pressurePa, flow }));

const base = {
  kind: 'testIn' as const,
  method: 'multipoint' as const,
  testedOn: '2026-03-14',
  cfm50: '',
  exponentN: '',
  note: '',
};

describe('a multipoint draft', () => {
  it('keeps the filled rows, in order, and leaves blank rows out', () => {
    const check = checkDraft(
      {
        ...base,
        rows: rows([
          ['50', '2,400'],
          ['', ''],
          ['40', '2100'],
          ['30', '1790'],
        ]),
      },
      'IP',
    );
    expect(check.errors).toEqual({});
    expect(check.test).toEqual({
      kind: 'testIn',
      testedOn: '2026-03-14',
      points: [
        { pa: 50, cfm: 2400 },
        { pa: 40, cfm: 2100 },
        { pa: 30, cfm: 1790 },
      ],
    });
  });

  it('stores flows typed in L/s in cfm (NIST SP 811: 1 cfm ≈ 0.4719474 L/s)', () => {
    const litersPerSecondPerCfm = (0.3048 ** 3 * 1000) / 60;
    expect(litersPerSecondPerCfm).toBeCloseTo(0.4719474, 7);
    const check = checkDraft(
      {
        ...base,
        rows: rows([
          ['50', '1000'],
          ['25', '640'],
        ]),
      },
      'SI',
    );
    expect(check.test?.points?.[0]?.cfm).toBeCloseTo(1000 / litersPerSecondPerCfm, 6);
    expect(check.test?.points?.[1]?.pa).toBe(25);
  });

  it('names each box that is half filled or not a number', () => {
    const check = checkDraft(
      {
        ...base,
        rows: rows([
          ['50', ''],
          ['4o', '1200'],
          ['30', '900'],
        ]),
      },
      'IP',
    );
    expect(check.test).toBeNull();
    expect(Object.keys(check.errors).sort()).toEqual(['reading-0-flow', 'reading-1-pa']);
  });

  it('asks for two readings at least', () => {
    const check = checkDraft(
      {
        ...base,
        rows: rows([
          ['50', '2400'],
          ['', ''],
        ]),
      },
      'IP',
    );
    expect(check.errors).toEqual({ 'test-readings': expect.stringContaining('two readings') });
  });
});

describe('a one-point draft', () => {
  it('takes the CFM50 and an exponent when one is typed', () => {
    const check = checkDraft(
      { ...base, kind: 'testOut', method: 'onePoint', cfm50: '1,850', exponentN: '0.7', rows: [] },
      'IP',
    );
    expect(check.test).toEqual({
      kind: 'testOut',
      testedOn: '2026-03-14',
      cfm50: 1850,
      exponentN: 0.7,
    });
  });

  it('leaves the exponent out when the box is blank (the store assumes one)', () => {
    const check = checkDraft({ ...base, method: 'onePoint', cfm50: '1850', rows: [] }, 'IP');
    expect(check.test).toEqual({ kind: 'testIn', testedOn: '2026-03-14', cfm50: 1850 });
  });

  it('refuses a missing CFM50', () => {
    const check = checkDraft({ ...base, method: 'onePoint', rows: [] }, 'IP');
    expect(Object.keys(check.errors)).toEqual(['test-cfm50']);
  });
});
