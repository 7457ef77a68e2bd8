/**
 * A blower-door test as typed into the Leak test section's form, checked before it goes to
 * the store: numbers in digits, blank reading rows left out, at least two readings for a
 * multipoint test, flows typed in L/s turned into the stored cfm. Pure, so it is tested on
 * its own; the store (tests.add) still has the last word.
 */
import type { LeakageTestKind, OtherLeakageTest } from '../core/schema.ts';
import { parseNumber } from './text.ts';
import { storedValue, type UnitSystem } from './quantities.ts';

export type TestMethod = 'onePoint' | 'multipoint';

export interface ReadingRow {
  /** Stable across additions and removals, for the boxes' ids. */
  key: number;
  pressurePa: string;
  flow: string;
}

/** The draft's problems by box id, and the test when every box holds what it should. */
export interface DraftCheck {
  test: OtherLeakageTest | null;
  errors: Record<string, string>;
}

/**
 * Checks what was typed. Blank reading rows are left out; a row with one box filled is a
 * problem. Flows typed in L/s are stored in cfm.
 */
export function checkDraft(
  draft: {
    kind: LeakageTestKind;
    method: TestMethod;
    testedOn: string;
    cfm50: string;
    exponentN: string;
    rows: readonly ReadingRow[];
    note: string;
  },
  units: UnitSystem,
): DraftCheck {
  const errors: Record<string, string> = {};
  const test: OtherLeakageTest = { kind: draft.kind };
  if (draft.testedOn.trim() !== '') test.testedOn = draft.testedOn.trim();
  if (draft.note.trim() !== '') test.note = draft.note.trim();
  if (draft.method === 'onePoint') {
    const cfm50 = parseNumber(draft.cfm50);
    if (cfm50 === null) errors['test-cfm50'] = 'Enter the flow at 50 Pa, in digits.';
    else test.cfm50 = storedValue('flowCfm', cfm50, units);
    if (draft.exponentN.trim() !== '') {
      const exponent = parseNumber(draft.exponentN);
      if (exponent === null)
        errors['test-exponent'] = 'Enter the exponent in digits, or leave it blank.';
      else test.exponentN = exponent;
    }
  } else {
    const points: { pa: number; cfm: number }[] = [];
    for (const row of draft.rows) {
      const pressureBlank = row.pressurePa.trim() === '';
      const flowBlank = row.flow.trim() === '';
      if (pressureBlank && flowBlank) continue;
      const pa = parseNumber(row.pressurePa);
      const flow = parseNumber(row.flow);
      if (pa === null) errors[`reading-${row.key}-pa`] = 'Enter the pressure in digits.';
      if (flow === null) errors[`reading-${row.key}-flow`] = 'Enter the flow in digits.';
      if (pa !== null && flow !== null)
        points.push({ pa, cfm: storedValue('flowCfm', flow, units) });
    }
    if (points.length < 2 && Object.keys(errors).length === 0) {
      errors['test-readings'] = 'Enter at least two readings of pressure and flow.';
    }
    test.points = points;
  }
  return { test: Object.keys(errors).length === 0 ? test : null, errors };
}
