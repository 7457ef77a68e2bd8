/**
 * The materials catalogue (core/measure-library/materials.ts) and the materials every library
 * measure type lists. Yields are recomputed here from the bead geometry with the unit facts
 * written out independently: 1 US gallon = 231 in³ exactly and 128 fl oz (NIST SP 811,
 * appendix B; NIST Handbook 44, appendix C), 1 ft³ = 1728 in³, 1 lb = 16 oz.
 */
import { describe, expect, it } from 'vitest';
import { MEASURE_LIBRARY, type MeasureType } from '../../core/measure-library.ts';
import { MATERIAL_IDS, MATERIALS, type MaterialId } from '../../core/measure-library/materials.ts';

const IN3_PER_GALLON = 231;
const FL_OZ_PER_GALLON = 128;

describe('materials catalogue', () => {
  it('has one entry per id, each with a purchase unit, a positive yield and a marked source', () => {
    expect(Object.keys(MATERIALS).sort()).toEqual([...MATERIAL_IDS].sort());
    for (const id of MATERIAL_IDS) {
      const material = MATERIALS[id];
      expect(material.id).toBe(id);
      expect(material.name.trim()).not.toBe('');
      expect(material.purchaseUnit.one.trim()).not.toBe('');
      expect(material.yieldPerPurchaseUnit, id).toBeGreaterThan(0);
      expect(Number.isInteger(material.yieldPerPurchaseUnit), id).toBe(true);
      expect(['common practice', 'from memory', 'published']).toContain(material.source.mark);
      expect(material.yieldWorking.trim().length, id).toBeGreaterThan(5);
    }
  });

  it('gives a 10.1 fl oz tube 24 ft of 1/4-inch bead', () => {
    // 10.1 fl oz × 231/128 in³ = 18.23 in³; a 1/4 × 1/4 in bead is 0.75 in³ per ft → 24.3 ft.
    // From memory: makers' coverage charts print about 24 ft for a 1/4-inch bead.
    const volumeIn3 = (10.1 * IN3_PER_GALLON) / FL_OZ_PER_GALLON;
    const feet = Math.floor(volumeIn3 / (0.25 * 0.25 * 12));
    expect(feet).toBe(24);
    for (const id of [
      'sealant-tube',
      'fire-rated-sealant-tube',
      'high-temperature-sealant-tube',
    ] as const) {
      expect(MATERIALS[id].yieldPerPurchaseUnit).toBe(feet);
      expect(MATERIALS[id].purchaseUnit).toEqual({ one: 'tube', many: 'tubes' });
    }
  });

  it('gives foam cans their cured volume at 2 lb/ft³ in 1/2-inch bead', () => {
    // From memory: one-part foam cures at about 1.5–2 lb/ft³; 2 taken. 12 oz = 0.75 lb →
    // 0.375 ft³ = 648 in³; a 1/2 × 1/2 in bead is 3 in³ per ft → 216 ft; 24 oz → 432 ft.
    expect(MATERIALS['foam-can-12oz'].yieldPerPurchaseUnit).toBe(
      Math.floor(((12 / 16 / 2) * 1728) / 3),
    );
    expect(MATERIALS['foam-can-12oz'].yieldPerPurchaseUnit).toBe(216);
    expect(MATERIALS['foam-can-24oz'].yieldPerPurchaseUnit).toBe(432);
  });

  it('gives a 4 × 8 sheet 32 ft² and a gallon of mastic 154 ft of 1-inch band 1/8 inch thick', () => {
    expect(MATERIALS['foam-board-sheet'].yieldPerPurchaseUnit).toBe(4 * 8);
    expect(MATERIALS['duct-mastic-pail'].yieldPerPurchaseUnit).toBe(
      Math.floor(IN3_PER_GALLON / (1 * 0.125 * 12)),
    );
    expect(MATERIALS['duct-mastic-pail'].yieldPerPurchaseUnit).toBe(154);
  });

  it('sells lengths by the foot', () => {
    for (const id of ['weatherstrip', 'backer-rod', 'metal-dryer-duct'] as const) {
      expect(MATERIALS[id].useUnit).toBe('linearFt');
      expect(MATERIALS[id].yieldPerPurchaseUnit).toBe(1);
      expect(MATERIALS[id].purchaseUnit.many).toBe('ft');
    }
  });
});

function materialIds(type: MeasureType): MaterialId[] {
  return (type.materials ?? []).map((use) => use.materialId);
}

describe('materials of the library measure types', () => {
  it('lists materials for every type, each a catalogue id with a positive quantity and a reason', () => {
    for (const type of MEASURE_LIBRARY) {
      expect(type.materials?.length ?? 0, type.id).toBeGreaterThan(0);
      for (const use of type.materials ?? []) {
        expect(MATERIAL_IDS, type.id).toContain(use.materialId);
        expect(use.quantityPerUnit, type.id).toBeGreaterThan(0);
        expect(Number.isFinite(use.quantityPerUnit)).toBe(true);
        expect(use.source.mark).toBe('common practice');
        expect(use.source.citation.trim().length, type.id).toBeGreaterThan(10);
      }
      expect(new Set(materialIds(type)).size, type.id).toBe(materialIds(type).length);
    }
  });

  it('puts only flue-safe materials on work tagged for flue clearance', () => {
    // The flue-clearance caution (core/safety/definitions.ts; common practice): only
    // noncombustible materials and high-temperature sealant at a flue, never foam or board.
    const flueWork = MEASURE_LIBRARY.filter((type) => type.cautionCodes.includes('flue-clearance'));
    expect(flueWork.map((type) => type.id)).toContain('flue-chase');
    for (const type of [...flueWork, ...MEASURE_LIBRARY.filter((t) => t.location === 'flue')]) {
      for (const id of materialIds(type))
        expect(MATERIALS[id].flueSafe, `${type.id}: ${id}`).toBe(true);
      expect(materialIds(type)).toContain('high-temperature-sealant-tube');
    }
  });

  it('uses fire-rated sealant at the garage wall, as its description says', () => {
    const garage = MEASURE_LIBRARY.find((type) => type.id === 'garage-house-wall');
    expect(garage?.description).toMatch(/fire-rated sealant/);
    expect(materialIds(garage as MeasureType)).toContain('fire-rated-sealant-tube');
  });

  it('tags every type that uses canned foam with the spray-foam caution', () => {
    for (const type of MEASURE_LIBRARY) {
      const foam = materialIds(type).some((id) => id === 'foam-can-12oz' || id === 'foam-can-24oz');
      if (foam) expect(type.cautionCodes, type.id).toContain('spray-foam-handling');
    }
  });
});
