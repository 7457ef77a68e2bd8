/**
 * One measure's form as the page holds it, for adding a measure or changing a stored one:
 * the boxes as typed (kept until the store accepts them, so a refusal loses nothing), the
 * chosen estimate, and the problems beside each field. The rules of what the boxes mean are
 * the pure functions of ui/measure-fields.ts and ui/measure-form.ts.
 */
import type { LeakLocation } from '../../core/schema.ts';
import {
  refusalsByField,
  type EstimateMethod,
  type FieldContext,
  type FieldKey,
  type NumberKey,
  type Problem,
} from '../measure-fields.ts';
import {
  measureOfDraft,
  textOfField,
  type DraftValues,
  type MeasureFrame,
} from '../measure-form.ts';
import type { UnitSystem } from '../quantities.ts';

export type ActionStatus =
  | { kind: 'idle' }
  | { kind: 'working'; words: string }
  | { kind: 'done'; words: string }
  | { kind: 'refused'; words: string };

export class MeasureDraft {
  method = $state<EstimateMethod>('byUnits');
  base = $state<Partial<Record<NumberKey, number>>>({});
  typed = $state<Partial<Record<NumberKey, { text: string; units: UnitSystem }>>>({});
  location = $state<LeakLocation | ''>('');
  healthAndSafety = $state(false);
  note = $state('');
  errors = $state<Partial<Record<FieldKey, string>>>({});
  status = $state<ActionStatus>({ kind: 'idle' });

  constructor(values: DraftValues) {
    this.method = values.method;
    this.base = { ...values.base };
    this.typed = { ...values.typed };
    this.location = values.location;
    this.healthAndSafety = values.healthAndSafety;
    this.note = values.note;
  }

  /** The form as plain data, for the pure rules. */
  values(): DraftValues {
    return {
      method: this.method,
      base: { ...this.base },
      typed: { ...this.typed },
      location: this.location,
      healthAndSafety: this.healthAndSafety,
      note: this.note,
    };
  }

  textOf(key: NumberKey, context: FieldContext, fallbackStored?: number): string {
    return textOfField(this.values(), key, context, fallbackStored);
  }

  type(key: NumberKey, text: string, units: UnitSystem): void {
    this.typed[key] = { text, units };
  }

  wasTyped(key: NumberKey): boolean {
    return this.typed[key] !== undefined;
  }

  /** The measure the form describes; on problems, shows them beside the fields. */
  build(frame: MeasureFrame): ReturnType<typeof measureOfDraft> {
    const made = measureOfDraft(this.values(), frame);
    this.errors = 'problems' in made ? made.problems : {};
    return made;
  }

  /** Shows a store's refusal beside the fields; returns the problems of no field. */
  refuse(problems: readonly Problem[], context: FieldContext): Problem[] {
    const { errors, unplaced } = refusalsByField(problems, context);
    this.errors = errors;
    return unplaced;
  }

  /** Forgets what was typed, once the store has it. */
  settle(): void {
    this.typed = {};
    this.errors = {};
  }
}
