/**
 * The measure form's rules (ui/measure-fields.ts, ui/measure-form.ts): what typed text becomes in the store, and
 * how the store's refusals read in the units on the screen.
 *
 * Sources: the conversion factors follow from the exact foot and inch of NIST SP 811 (2008),
 * appendix B: 1 ft = 0.3048 m, 1 in = 2.54 cm, so 1 ft³/min = 0.3048³ × 1000 / 60 L/s
 * ≈ 0.4719474 L/s and 1 in² = 6.4516 cm². The store's messages and bounds are the core's own
 * (core/schema.ts through core/_lib/zod-problems.ts), produced here by the core, not retyped;
 * the by-quantity estimate is checked against the core's estimateReductionCfm50.
 */
import { describe, expect, it } from 'vitest';
import { problemsFromZod } from '../../core/_lib/zod-problems.ts';
import { findMeasureType } from '../../core/measure-library.ts';
import { estimateReductionCfm50 } from '../../core/measures.ts';
import { measureSchema, type Measure } from '../../core/schema.ts';
import {
  boxText,
  fieldOfPath,
  messageInShownUnits,
  refusalsByField,
  storedOfTyped,
  type FieldContext,
} from '../../ui/measure-fields.ts';
import {
  byUnitsEstimateCfm50,
  draftOfMeasure,
  measureOfDraft,
  sameMeasure,
  textOfField,
  type DraftValues,
} from '../../ui/measure-form.ts';
import { perShownWork, workAmountWords } from '../../ui/quantities.ts';

/** NIST SP 811 (2008), appendix B: exact definitions of the foot and the inch. */
const METERS_PER_FOOT = 0.3048;
const SQUARE_CM_PER_SQUARE_INCH = 2.54 * 2.54;
const LITERS_PER_SECOND_PER_CFM = (METERS_PER_FOOT ** 3 * 1000) / 60;

const IP_EACH: FieldContext = { units: 'IP', workUnit: 'each' };
const SI_EACH: FieldContext = { units: 'SI', workUnit: 'each' };
const SI_FEET: FieldContext = { units: 'SI', workUnit: 'linearFt' };

/** The store's own problems for a measure, as the channel would list them (paths without `measure.`). */
function storeProblems(measure: unknown): { path: string; message: string }[] {
  const parsed = measureSchema.safeParse(measure);
  if (parsed.success) throw new Error('expected the store to refuse this measure');
  return problemsFromZod(parsed.error, measure);
}

const stored: Measure = {
  id: 'sill-1',
  type: 'sill-plate',
  reductionCfm50: { low: 200, likely: 350, high: 500 },
  cost: { materialsUsd: 140, laborHours: 8, laborRateUsdPerHour: 58, markupFraction: 0.15 },
};

describe('boxes in SI', () => {
  it('shows a stored cfm in L/s and turns typed L/s back into cfm by the exact foot', () => {
    expect(boxText('cfmLikely', 100, SI_EACH)).toBe(
      String(Math.round(100 * LITERS_PER_SECOND_PER_CFM * 100) / 100),
    );
    expect(storedOfTyped('cfmLikely', 100, SI_EACH)).toBeCloseTo(
      100 / LITERS_PER_SECOND_PER_CFM,
      9,
    );
  });

  it('reads a length of work typed in metres as feet, and a count as it is', () => {
    expect(storedOfTyped('units', 10, SI_FEET)).toBeCloseTo(10 / METERS_PER_FOOT, 9);
    expect(storedOfTyped('units', 10, SI_EACH)).toBe(10);
  });

  it('gives a figure per foot as the same figure per metre', () => {
    const cm2PerM = perShownWork(0.07 * SQUARE_CM_PER_SQUARE_INCH, 'linearFt', 'SI');
    expect(cm2PerM).toBeCloseTo((0.07 * SQUARE_CM_PER_SQUARE_INCH) / METERS_PER_FOOT, 9);
    expect(perShownWork(0.07, 'each', 'SI')).toBe(0.07);
    expect(workAmountWords(150, 'linearFt', 'SI')).toBe(
      `${Math.round(150 * METERS_PER_FOOT * 100) / 100} m`,
    );
    expect(workAmountWords(1, 'each', 'IP')).toBe('1 unit');
  });

  it('takes percentages for the markup and the shares', () => {
    expect(storedOfTyped('markup', 15, IP_EACH)).toBeCloseTo(0.15, 12);
    expect(boxText('shareLikely', 0.42, IP_EACH)).toBe('42');
  });
});

describe('the store’s refusals in the shown units', () => {
  it('says the CFM50 limit in L/s when the person works in SI', () => {
    const problems = storeProblems({
      ...stored,
      reductionCfm50: { low: 200, likely: 350, high: 150_000 },
    });
    const high = problems.find((problem) => problem.path === 'reductionCfm50.high');
    if (high === undefined) throw new Error('the store did not name the high box');
    const limitCfm = Number(/at most (\d+)/.exec(high.message)?.[1]);
    expect(limitCfm).toBeGreaterThan(0);
    const words = messageInShownUnits('cfmHigh', high.message, SI_EACH);
    const limitWords = (limitCfm * LITERS_PER_SECOND_PER_CFM).toLocaleString('en-US', {
      maximumFractionDigits: 2,
    });
    const givenWords = (150_000 * LITERS_PER_SECOND_PER_CFM).toLocaleString('en-US', {
      maximumFractionDigits: 2,
    });
    expect(words).toContain(`at most ${limitWords} L/s at 50 Pa`);
    expect(words).toContain(`got ${givenWords} L/s at 50 Pa`);
    expect(words).not.toContain(String(limitCfm));
  });

  it('puts each problem beside its field, a range’s order beside the range', () => {
    const problems = storeProblems({
      ...stored,
      reductionCfm50: { low: 300, likely: 100, high: 200 },
      cost: { ...stored.cost, laborHours: -1, markupFraction: 6 },
      lifeYears: 2.5,
    });
    const { errors, unplaced } = refusalsByField(problems, SI_EACH, '');
    expect(unplaced).toEqual([]);
    expect(Object.keys(errors).sort()).toEqual(['cfmRange', 'laborHours', 'lifeYears', 'markup']);
    const perCfm = (cfm: number) =>
      (cfm * LITERS_PER_SECOND_PER_CFM).toLocaleString('en-US', { maximumFractionDigits: 2 });
    expect(errors.cfmRange).toContain(`${perCfm(300)} / ${perCfm(100)} / ${perCfm(200)} L/s`);
    expect(errors.laborHours).toMatch(/^Expected a number of at least 0 hours, got -1 hours\.$/);
    // The markup is stored as a fraction (at most 5) and typed as a percentage.
    expect(errors.markup).toContain('at most 500%, got 600%');
    expect(errors.lifeYears).toMatch(/whole number/);
  });

  it('names the fields by their request paths, and no others', () => {
    expect(fieldOfPath('measure.cost.markupFraction')).toBe('markup');
    expect(fieldOfPath('measure.shareOfLocation.share')).toBe('shareRange');
    expect(fieldOfPath('measure.shareOfLocation.share.high')).toBe('shareHigh');
    expect(fieldOfPath('measure.id')).toBeNull();
    expect(fieldOfPath('home.data.house.heightFt')).toBeNull();
  });
});

describe('a form becomes a measure', () => {
  it('keeps what was not typed exactly, even where the box shows it rounded', () => {
    const draft = draftOfMeasure(stored);
    expect(textOfField(draft, 'cfmLikely', SI_EACH)).toBe(
      String(Math.round(350 * LITERS_PER_SECOND_PER_CFM * 100) / 100),
    );
    const made = measureOfDraft(draft, { id: stored.id, type: stored.type, workUnit: 'linearFt' });
    if (!('measure' in made)) throw new Error('the untouched form was refused');
    expect(made.measure.reductionCfm50).toEqual(stored.reductionCfm50);
    expect(sameMeasure(made.measure, stored)).toBe(true);
    expect(measureSchema.safeParse(made.measure).success).toBe(true);
  });

  it('stores what was typed in SI in the store’s units, and an emptied life follows the library', () => {
    const draft: DraftValues = {
      ...draftOfMeasure({ ...stored, lifeYears: 30 }),
      method: 'byUnits',
      typed: {
        units: { text: '12', units: 'SI' },
        markup: { text: '20', units: 'SI' },
        lifeYears: { text: '', units: 'SI' },
      },
      location: 'floor',
      healthAndSafety: true,
      note: 'Behind the freezer',
    };
    const made = measureOfDraft(draft, { id: 'sill-1', type: 'sill-plate', workUnit: 'linearFt' });
    if (!('measure' in made)) throw new Error(`refused: ${JSON.stringify(made.problems)}`);
    expect(made.measure.byUnits?.units).toBeCloseTo(12 / METERS_PER_FOOT, 9);
    expect(made.measure.reductionCfm50).toBeUndefined();
    expect(made.measure.cost.markupFraction).toBeCloseTo(0.2, 12);
    expect(made.measure.cost.healthAndSafety).toBe(true);
    expect(made.measure.lifeYears).toBeUndefined();
    expect(made.measure.location).toBe('floor');
    expect(made.measure.note).toBe('Behind the freezer');
    expect(measureSchema.safeParse(made.measure).success).toBe(true);
  });

  it('refuses empty and non-numeric boxes itself, naming each', () => {
    const draft: DraftValues = {
      ...draftOfMeasure(stored),
      method: 'share',
      typed: { materialsUsd: { text: 'about 40', units: 'IP' } },
    };
    const made = measureOfDraft(draft, { id: 'sill-1', type: 'sill-plate', workUnit: 'linearFt' });
    if (!('problems' in made)) throw new Error('an empty share was accepted');
    expect(Object.keys(made.problems).sort()).toEqual([
      'materialsUsd',
      'shareHigh',
      'shareLikely',
      'shareLow',
    ]);
  });

  it('shows a typed figure in the new units when the system changes, reading it as typed', () => {
    const draft: DraftValues = {
      ...draftOfMeasure(stored),
      typed: { cfmHigh: { text: '100', units: 'SI' } },
    };
    expect(textOfField(draft, 'cfmHigh', IP_EACH)).toBe(
      String(Math.round((100 / LITERS_PER_SECOND_PER_CFM) * 100) / 100),
    );
  });
});

describe('the library’s estimate by quantity', () => {
  it('matches the core’s estimate of the same measure', () => {
    const type = findMeasureType('sill-plate') ?? findMeasureType('attic-top-plates');
    if (type === undefined) throw new Error('no library type to check with');
    const exponentN = 0.65;
    const core = estimateReductionCfm50(
      { id: 'x', type: type.id, byUnits: { units: 40 }, cost: stored.cost },
      type,
      { exponentN, testIn: { ceiling: 0, wall: 0, floor: 0, flue: 0 } },
    );
    const page = byUnitsEstimateCfm50({
      unitsCount: 40,
      areaIn2PerUnit: type.leakageAreaIn2PerUnit,
      sealed: type.sealingEffectiveness,
      exponentN,
    });
    expect(page.low).toBeCloseTo(core.range.low, 9);
    expect(page.likely).toBeCloseTo(core.range.likely, 9);
    expect(page.high).toBeCloseTo(core.range.high, 9);
  });
});
