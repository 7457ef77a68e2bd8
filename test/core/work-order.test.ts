/**
 * The crew's work order (core/work-order.ts): the bill of materials checked against a hand
 * computation from the library's per-unit defaults, the cautions of each measure and of the
 * house, and bad input. The houses are small invented ones built here, not the demo homes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { findMeasureType } from '../../core/measure-library.ts';
import type { MaterialId } from '../../core/measure-library/materials.ts';
import { packageFigures } from '../../core/plan/best-package.ts';
import { DEFERRAL } from '../../core/safety.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { buildWorkOrder, renderWorkOrderText, type WorkOrder } from '../../core/work-order.ts';
import { billOfMaterials } from '../../core/work-order/bill-of-materials.ts';
import { alignedColumns } from '../../core/work-order/text.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

type Measure = HomeFileInput['measures'][number];

const COST = { materialsUsd: 50, laborHours: 2, laborRateUsdPerHour: 50 };

function byUnits(id: string, type: string, units: number, extra: Partial<Measure> = {}): Measure {
  return { id, type, byUnits: { units }, cost: { ...COST }, ...extra };
}

function direct(id: string, type: string, likely: number, extra: Partial<Measure> = {}): Measure {
  return {
    id,
    type,
    reductionCfm50: { low: likely / 2, likely, high: likely * 1.5 },
    cost: { ...COST },
    ...extra,
  };
}

/** The base test house (test/_lib/base-home.ts) with other measures and house facts. */
function homeWith(
  measures: Measure[],
  change: (home: HomeFileInput) => void = () => {},
): HomeFileInput {
  const home = validBaseHome() as unknown as HomeFileInput;
  home.measures = measures;
  change(home);
  return home;
}

/** The library's use of a material per unit of a measure type (the defaults under test). */
function perUnit(typeId: string, materialId: MaterialId): number | undefined {
  return findMeasureType(typeId)?.materials?.find((use) => use.materialId === materialId)
    ?.quantityPerUnit;
}

function bill(order: WorkOrder, materialId: MaterialId) {
  return order.billOfMaterials.find((line) => line.materialId === materialId);
}

const BILL_HOME = homeWith([
  byUnits('plates', 'attic-top-plates', 120),
  byUnits('windows', 'window-sealing', 6),
  byUnits('doors', 'door-weatherstrip', 2),
  byUnits('rim', 'rim-joist', 37.5),
  byUnits('pipes', 'plumbing-penetrations', 7),
  byUnits('flue', 'flue-chase', 1),
  direct('garage', 'garage-house-wall', 60),
  direct('lights', 'recessed-lights', 40, { note: 'Hall and kitchen, six cans' }),
  byUnits('baseboards', 'baseboard-sealing', 40, { status: 'done' }),
]);
const BILL_IDS = [
  'plates',
  'windows',
  'doors',
  'rim',
  'pipes',
  'flue',
  'garage',
  'lights',
  'baseboards',
];

describe('bill of materials', () => {
  it('uses the library defaults the hand computation below assumes', () => {
    // Common practice, as written in the library entries (see their reasons).
    expect(perUnit('attic-top-plates', 'sealant-tube')).toBe(1.5);
    expect(perUnit('window-sealing', 'sealant-tube')).toBe(16);
    expect(perUnit('window-sealing', 'weatherstrip')).toBe(13);
    expect(perUnit('door-weatherstrip', 'weatherstrip')).toBe(17);
    expect(perUnit('door-weatherstrip', 'door-sweep')).toBe(1);
    expect(perUnit('door-weatherstrip', 'sealant-tube')).toBe(17);
    expect(perUnit('rim-joist', 'foam-board-sheet')).toBe(0.75);
    expect(perUnit('rim-joist', 'foam-can-24oz')).toBe(3);
    expect(perUnit('plumbing-penetrations', 'foam-can-12oz')).toBe(1);
    expect(perUnit('flue-chase', 'sheet-metal')).toBe(6);
    expect(perUnit('flue-chase', 'high-temperature-sealant-tube')).toBe(13);
    expect(perUnit('garage-house-wall', 'fire-rated-sealant-tube')).toBe(60);
    expect(perUnit('garage-house-wall', 'weatherstrip')).toBe(17);
    expect(perUnit('garage-house-wall', 'door-sweep')).toBe(1);
    expect(perUnit('recessed-lights', 'recessed-light-cover')).toBe(1);
    expect(perUnit('recessed-lights', 'sealant-tube')).toBe(4.5);
  });

  it('sums each material across measures and rounds up to whole purchase units', () => {
    const order = buildWorkOrder(evaluateHome(BILL_HOME), {
      measureIds: BILL_IDS,
      quantities: { lights: 5 },
    });
    // Hand computation: quantity × use per unit, summed; ⌈sum / yield⌉ with the yields of the
    // catalogue test (24 ft per tube, 216 / 432 ft per 12 / 24 oz can, 32 ft² per sheet).
    // Sealant: 120 × 1.5 + 6 × 16 + 2 × 17 + 5 × 4.5 = 180 + 96 + 34 + 22.5 = 332.5 ft → 13.85 → 14.
    expect(bill(order, 'sealant-tube')).toMatchObject({
      useQuantity: 332.5,
      purchaseCount: 14,
      purchaseUnitWords: 'tubes',
    });
    // In the order the package applies them (health and safety first, then by rank).
    expect([...(bill(order, 'sealant-tube')?.measureIds ?? [])].sort()).toEqual([
      'doors',
      'lights',
      'plates',
      'windows',
    ]);
    // Weatherstrip by the foot: 6 × 13 + 2 × 17 + 1 × 17 = 78 + 34 + 17 = 129 ft.
    expect(bill(order, 'weatherstrip')).toMatchObject({
      useQuantity: 129,
      purchaseCount: 129,
      purchaseUnitWords: 'ft',
    });
    // Sweeps: 2 doors + the garage's house door = 3.
    expect(bill(order, 'door-sweep')).toMatchObject({ useQuantity: 3, purchaseCount: 3 });
    // Board: 37.5 × 0.75 = 28.125 ft² → 1 sheet; foam: 37.5 × 3 = 112.5 ft → 1 can of 24 oz.
    expect(bill(order, 'foam-board-sheet')).toMatchObject({
      useQuantity: 28.125,
      purchaseCount: 1,
      purchaseUnitWords: 'sheet',
    });
    expect(bill(order, 'foam-can-24oz')).toMatchObject({ useQuantity: 112.5, purchaseCount: 1 });
    expect(bill(order, 'foam-can-12oz')).toMatchObject({ useQuantity: 7, purchaseCount: 1 });
    // Flue: 6 ft² of metal, 13 ft of high-temperature sealant → 1 tube; garage: 60 ft → 2.5 → 3.
    expect(bill(order, 'sheet-metal')).toMatchObject({ useQuantity: 6, purchaseCount: 6 });
    expect(bill(order, 'high-temperature-sealant-tube')).toMatchObject({
      useQuantity: 13,
      purchaseCount: 1,
    });
    expect(bill(order, 'fire-rated-sealant-tube')).toMatchObject({
      useQuantity: 60,
      purchaseCount: 3,
    });
    expect(bill(order, 'recessed-light-cover')).toMatchObject({ useQuantity: 5, purchaseCount: 5 });
    // The done baseboards buy nothing and take no hours: 8 measures × 2 h = 16 h.
    expect(order.billOfMaterials).toHaveLength(10);
    expect(order.billOfMaterials.some((line) => line.measureIds.includes('baseboards'))).toBe(
      false,
    );
    expect(order.laborHoursTotal).toBe(16);
  });

  it('buys exactly two tubes for 48 ft, not three (no float drift at a whole count)', () => {
    // 30 ft × 1 + 12 ft × 1.5 = 48 ft = 2 × 24 ft.
    const home = homeWith([
      byUnits('base', 'baseboard-sealing', 30),
      byUnits('plates', 'attic-top-plates', 12),
    ]);
    const order = buildWorkOrder(evaluateHome(home), { measureIds: ['base', 'plates'] });
    expect(bill(order, 'sealant-tube')).toMatchObject({ useQuantity: 48, purchaseCount: 2 });
  });

  it('gives each measure its quantity, unit, materials, hours, place and note', () => {
    const order = buildWorkOrder(evaluateHome(BILL_HOME), {
      measureIds: BILL_IDS,
      quantities: { lights: 5 },
    });
    const rim = order.measures.find((measure) => measure.id === 'rim');
    expect(rim).toMatchObject({
      quantity: 37.5,
      quantitySource: 'units',
      unit: 'linearFt',
      unitWords: 'ft',
      laborHours: 2,
      location: 'floor',
    });
    expect(rim?.materials.map((need) => [need.materialId, need.quantity])).toEqual([
      ['foam-board-sheet', 28.125],
      ['foam-can-24oz', 112.5],
    ]);
    const garage = order.measures.find((measure) => measure.id === 'garage');
    expect(garage).toMatchObject({ quantity: 1, quantitySource: 'job', unitWords: 'job' });
    const lights = order.measures.find((measure) => measure.id === 'lights');
    expect(lights).toMatchObject({
      quantity: 5,
      quantitySource: 'given',
      note: 'Hall and kitchen, six cans',
    });
    expect(order.measures.find((measure) => measure.id === 'baseboards')?.status).toBe('done');
  });

  it('leaves out the materials of a measure with no count, and says so', () => {
    const order = buildWorkOrder(evaluateHome(BILL_HOME), { measureIds: ['lights', 'plates'] });
    expect(order.measures.find((measure) => measure.id === 'lights')).toMatchObject({
      quantity: null,
      materials: [],
    });
    expect(order.notes.join(' ')).toMatch(/lights: no count/);
    expect(bill(order, 'sealant-tube')?.useQuantity).toBe(180);
  });
});

const HAZARD_HOME = homeWith(
  [
    byUnits('flue', 'flue-chase', 1, { cost: { ...COST, healthAndSafety: true } }),
    byUnits('lights', 'recessed-lights', 6, { cost: { ...COST, healthAndSafety: true } }),
    byUnits('dryer', 'dryer-vent', 1, { cost: { ...COST, healthAndSafety: true } }),
    byUnits('doors', 'door-weatherstrip', 2, { cost: { ...COST, healthAndSafety: true } }),
  ],
  (home) => {
    home.house.yearBuilt = 1950;
    home.house.knobAndTubeWiring = true;
    home.house.vermiculiteSuspected = true;
  },
);

describe('bill of materials: property', () => {
  it('buys the fewest whole units that cover the need: (n − 1)·yield < need ≤ n·yield', () => {
    // Needs in quarter feet, so the sums are exact in binary and the check below is exact.
    const need = fc.record({
      id: fc.constantFrom('a', 'b', 'c'),
      quarters: fc.integer({ min: 1, max: 4000 }),
    });
    fc.assert(
      fc.property(fc.array(need, { minLength: 1, maxLength: 12 }), (needs) => {
        const lines = billOfMaterials(
          needs.map((item, index) => ({
            id: `${item.id}${index}`,
            needs: [
              {
                materialId: 'sealant-tube',
                name: 'Sealant',
                quantity: item.quarters / 4,
                useUnitWords: 'ft of 1/4-inch bead',
              },
            ],
          })),
        );
        const totalFt = needs.reduce((sum, item) => sum + item.quarters, 0) / 4;
        expect(lines).toHaveLength(1);
        const line = lines[0];
        expect(line?.useQuantity).toBe(totalFt);
        const count = line?.purchaseCount ?? 0;
        // 24 ft per tube (the catalogue test's geometry).
        expect(count * 24).toBeGreaterThanOrEqual(totalFt);
        expect((count - 1) * 24).toBeLessThan(totalFt);
      }),
      { seed: 9, numRuns: 200 },
    );
  });
});

describe('cautions of the work order', () => {
  const evaluation = evaluateHome(HAZARD_HOME);
  const order = buildWorkOrder(evaluation);

  it('lists every measure of the package, each with the cautions of its own work', () => {
    // Health-and-safety measures are always in the package (10 CFR 440.21 keeps them out of
    // the SIR test), so the recommended package is these four, in the order given.
    expect(order.measures.map((measure) => measure.id)).toEqual([
      'flue',
      'lights',
      'dryer',
      'doors',
    ]);
    const codes = (id: string) =>
      order.measures
        .find((measure) => measure.id === id)
        ?.cautions.map((c) => c.code)
        .sort();
    // The house has knob-and-tube wiring and suspect vermiculite, and was built before 1978
    // (lead: 40 CFR 745.103); flue clearance, recessed-light ratings and dryer ducts always
    // apply to work of those kinds (common practice).
    expect(codes('flue')).toEqual(['flue-clearance', 'knob-and-tube-wiring', 'vermiculite']);
    expect(codes('lights')).toEqual([
      'knob-and-tube-wiring',
      'recessed-light-rating',
      'vermiculite',
    ]);
    expect(codes('dryer')).toEqual(['dryer-vent']);
    expect(codes('doors')).toEqual(['lead-safe-work']);
    const flue = order.measures[0]?.cautions.find((caution) => caution.code === 'flue-clearance');
    expect(flue?.severity).toBe('danger');
    expect(flue?.message).toMatch(/noncombustible/);
  });

  it('puts combustion and ventilation cautions under the house, and every caution defers to codes', () => {
    const houseCodes = order.houseCautions.map((caution) => caution.code);
    // The base house has a natural-draft gas water heater inside the pressure boundary.
    expect(houseCodes).toContain('combustion-safety-test');
    expect(houseCodes).toContain('natural-draft-appliance');
    for (const code of [
      'flue-clearance',
      'knob-and-tube-wiring',
      'vermiculite',
      'lead-safe-work',
      'dryer-vent',
    ]) {
      expect(houseCodes).not.toContain(code);
    }
    const all = [...order.houseCautions, ...order.measures.flatMap((measure) => measure.cautions)];
    for (const caution of all) expect(caution.message.endsWith(DEFERRAL)).toBe(true);
    expect(order.target.caution).toMatch(/local codes and licensed practice/);
  });

  it('raises for the recommended package the cautions the evaluation raised', () => {
    const listed = new Map(
      [...order.houseCautions, ...order.measures.flatMap((measure) => measure.cautions)].map(
        (c) => [c.code, c],
      ),
    );
    expect([...listed.values()].sort((a, b) => (a.code < b.code ? -1 : 1))).toEqual(
      [...evaluation.cautions].sort((a, b) => (a.code < b.code ? -1 : 1)),
    );
    expect(order.target.targetCfm50).toBe(evaluation.plan.package.cfm50After);
  });

  it('replays a chosen package the way the proposal values it', () => {
    const home = homeWith(
      [...HAZARD_HOME.measures, byUnits('plates', 'attic-top-plates', 200)],
      (h) => {
        h.house.yearBuilt = 1950;
      },
    );
    const evaluated = evaluateHome(home);
    const order = buildWorkOrder(evaluated, {
      measureIds: ['plates', 'flue', 'lights', 'dryer', 'doors'],
    });
    // Health and safety first, then the rest (core/plan/best-package.ts canonicalMeasures).
    expect(order.measures.map((measure) => measure.id)).toEqual([
      'flue',
      'lights',
      'dryer',
      'doors',
      'plates',
    ]);
    expect(order.target.targetCfm50).toBeCloseTo(
      packageFigures(evaluated, ['plates']).cfm50After,
      9,
    );
  });
});

describe('bad input', () => {
  const evaluation = evaluateHome(BILL_HOME);

  it('names the measure id that is not in the home, is repeated or declined', () => {
    expectInputError(
      () => buildWorkOrder(evaluation, { measureIds: ['plates', 'attic'] }),
      'measureIds[1]',
      /"attic"/,
    );
    expectInputError(
      () => buildWorkOrder(evaluation, { measureIds: ['plates', 'plates'] }),
      'measureIds[1]',
      /twice/,
    );
    const declined = evaluateHome(
      homeWith([
        byUnits('a', 'sill-plate', 10),
        byUnits('b', 'sill-plate', 10, { status: 'declined' }),
      ]),
    );
    expectInputError(
      () => buildWorkOrder(declined, { measureIds: ['a', 'b'] }),
      'measureIds[1]',
      /declined/,
    );
  });

  it('refuses an empty package', () => {
    expectInputError(
      () => buildWorkOrder(evaluation, { measureIds: [] }),
      'measureIds',
      /at least one/,
    );
    // A measure that cannot pay and is not health and safety leaves the plan with nothing.
    const nothing = evaluateHome(
      homeWith([
        byUnits('costly', 'sill-plate', 1, {
          cost: { materialsUsd: 100_000, laborHours: 1, laborRateUsdPerHour: 50 },
        }),
      ]),
    );
    expect(nothing.plan.package.measureIds).toEqual([]);
    expectInputError(() => buildWorkOrder(nothing), 'measureIds', /recommends none/);
  });

  it('names the count that is not a package measure or not a positive number', () => {
    expectInputError(
      () => buildWorkOrder(evaluation, { measureIds: ['plates'], quantities: { lights: 3 } }),
      'quantities.lights',
      /in the package/,
    );
    for (const bad of [0, -2, Number.NaN, Number.POSITIVE_INFINITY]) {
      expectInputError(
        () => buildWorkOrder(evaluation, { measureIds: ['lights'], quantities: { lights: bad } }),
        'quantities.lights',
        /above 0/,
      );
    }
  });
});

describe('plain text', () => {
  it('aligns columns: text left, numbers right, two spaces apart', () => {
    expect(
      alignedColumns(
        [
          ['Item', 'Count'],
          ['Tube', '14'],
          ['Weatherstrip', '129'],
        ],
        [1],
      ),
    ).toEqual(['Item          Count', 'Tube             14', 'Weatherstrip    129']);
  });

  it('prints the target, every measure, the bill and the house cautions', () => {
    const order = buildWorkOrder(evaluateHome(HAZARD_HOME));
    const text = renderWorkOrderText(order);
    for (const measure of order.measures) expect(text).toContain(measure.name);
    expect(text).toContain(`${Math.round(order.target.targetCfm50).toLocaleString('en-US')} CFM50`);
    expect(text).toMatch(/Bill of materials/);
    expect(text).toContain('[danger] flue-clearance');
    expect(text).toContain('combustion-safety-test');
    for (const line of text.split('\n')) expect([...line].length).toBeLessThanOrEqual(120);
    // The measures table: each row as wide as its header, so the right-aligned column lines up.
    const lines = text.split('\n');
    const header = lines.findIndex((line) => line.trimStart().startsWith('#  Measure'));
    const rows = lines.slice(header, header + 1 + order.measures.length);
    expect(new Set(rows.map((line) => line.length)).size).toBe(1);
  });
});
