/**
 * The materials catalogue: what a crew buys for air sealing, the unit it is bought in, and how
 * much work one of those units does (its yield). Each measure type of the library lists the
 * materials its work uses per unit of the measure (`MeasureType.materials`); the work order
 * multiplies by the measure's quantity, sums across measures, and rounds up to whole purchase
 * units.
 *
 * Yields of tubes, cans and pails are computed here from the bead's cross-section, with the
 * arithmetic written out; they are rounded down to whole feet so a count of tubes errs high.
 * No waste allowance is added: rounding up to whole purchase units leaves the spare.
 */
import type { SourceNote } from './types.ts';

/** Cubic inches in one US fluid ounce: 231 in³ per US gallon ÷ 128 fl oz. Exact (NIST SP 811). */
export const CUBIC_INCHES_PER_US_FLUID_OUNCE = 231 / 128;

/** Cubic inches in one US gallon. Exact by definition (NIST SP 811, NIST Handbook 44). */
export const CUBIC_INCHES_PER_US_GALLON = 231;

/** Cubic inches in one cubic foot (12³). Exact. */
const CUBIC_INCHES_PER_CUBIC_FOOT = 1728;

/** Inches in a foot. Exact. */
const INCHES_PER_FOOT = 12;

/** Ounces (avoirdupois) in a pound. Exact. */
const OUNCES_PER_POUND = 16;

/**
 * Density of one-part polyurethane foam sealant as it cures in a gap, lb/ft³. From memory:
 * makers list about 1.5–2 lb/ft³; the upper end is taken, on the can's whole net weight
 * (propellant included), so the count of cans errs high.
 */
export const ONE_PART_FOAM_LB_PER_FT3 = 2;

/** Net contents of the common sealant cartridge, fl oz. Common practice (the trade's size). */
export const SEALANT_TUBE_FL_OZ = 10.1;

/**
 * Feet of bead that a volume of sealant lays, rounded down to whole feet.
 *
 * @param volumeIn3 - sealant volume, in³
 * @param beadWidthIn - bead width, in
 * @param beadDepthIn - bead depth, in
 * @returns whole feet of bead
 *
 * Notes: a bead of width w and depth d holds w·d·12 in³ per foot; feet = ⌊V / (w·d·12)⌋.
 * Makers' coverage charts use this square (w × d) bead.
 */
export function beadFeetOf(volumeIn3: number, beadWidthIn: number, beadDepthIn: number): number {
  return Math.floor(volumeIn3 / (beadWidthIn * beadDepthIn * INCHES_PER_FOOT));
}

/**
 * Cubic inches of cured one-part foam from a can's net weight.
 *
 * @param netOunces - the can's net weight, oz (avoirdupois)
 * @returns cured foam volume, in³
 *
 * Notes: V = (oz / 16 oz/lb) / ρ · 1728 in³/ft³, ρ = {@link ONE_PART_FOAM_LB_PER_FT3}.
 */
export function foamVolumeIn3(netOunces: number): number {
  return (netOunces / OUNCES_PER_POUND / ONE_PART_FOAM_LB_PER_FT3) * CUBIC_INCHES_PER_CUBIC_FOOT;
}

export const MATERIAL_IDS = [
  'sealant-tube',
  'fire-rated-sealant-tube',
  'high-temperature-sealant-tube',
  'foam-can-12oz',
  'foam-can-24oz',
  'foam-board-sheet',
  'weatherstrip',
  'door-sweep',
  'outlet-gasket',
  'sheet-metal',
  'duct-mastic-pail',
  'backer-rod',
  'recessed-light-cover',
  'attic-stair-cover',
  'backdraft-damper',
  'metal-dryer-duct',
  'dryer-vent-hood',
  'chimney-seal',
] as const;
export type MaterialId = (typeof MATERIAL_IDS)[number];

/** What a measure's quantity of a material is counted in. */
export type MaterialUseUnit = 'linearFt' | 'ft2' | 'each';

export interface Material {
  id: MaterialId;
  name: string;
  useUnit: MaterialUseUnit;
  /** The use unit in words, e.g. "ft of 1/4-inch bead". */
  useUnitWords: string;
  /** What is bought: a tube, a can, a sheet; "ft" or "ft²" for goods bought by length or area. */
  purchaseUnit: { one: string; many: string };
  /** Use units one purchase unit gives. */
  yieldPerPurchaseUnit: number;
  /** How the yield was found, with the arithmetic. */
  yieldWorking: string;
  /** Whether it may go against a flue or chimney (noncombustible or rated for the heat). */
  flueSafe: boolean;
  source: SourceNote;
}

const PRACTICE = (citation: string): SourceNote => ({ mark: 'common practice', citation });
const MEMORY = (citation: string): SourceNote => ({ mark: 'from memory', citation });

const TUBE_IN3 = SEALANT_TUBE_FL_OZ * CUBIC_INCHES_PER_US_FLUID_OUNCE;
const TUBE_BEAD_FT = beadFeetOf(TUBE_IN3, 0.25, 0.25);
const TUBE_WORKING = `10.1 fl oz × 1.8047 in³/fl oz = ${TUBE_IN3.toFixed(2)} in³; a 1/4 × 1/4 in bead holds 0.25 × 0.25 × 12 = 0.75 in³/ft; ${TUBE_IN3.toFixed(2)} / 0.75 = ${(TUBE_IN3 / 0.75).toFixed(1)}, rounded down to ${TUBE_BEAD_FT} ft`;
const TUBE_SOURCE = MEMORY(
  'Sealant makers’ coverage charts give about 24 ft of 1/4-inch bead per 10.1 fl oz cartridge, which the bead geometry reproduces',
);

function sealantTube(id: MaterialId, name: string, flueSafe: boolean): Material {
  return {
    id,
    name,
    useUnit: 'linearFt',
    useUnitWords: 'ft of 1/4-inch bead',
    purchaseUnit: { one: 'tube', many: 'tubes' },
    yieldPerPurchaseUnit: TUBE_BEAD_FT,
    yieldWorking: TUBE_WORKING,
    flueSafe,
    source: TUBE_SOURCE,
  };
}

function foamCan(id: MaterialId, netOunces: number): Material {
  const volumeIn3 = foamVolumeIn3(netOunces);
  const feet = beadFeetOf(volumeIn3, 0.5, 0.5);
  return {
    id,
    name: `One-part foam sealant, ${netOunces} oz can`,
    useUnit: 'linearFt',
    useUnitWords: 'ft of 1/2-inch bead',
    purchaseUnit: { one: 'can', many: 'cans' },
    yieldPerPurchaseUnit: feet,
    yieldWorking: `${netOunces} oz / 16 oz/lb = ${netOunces / OUNCES_PER_POUND} lb; at ${ONE_PART_FOAM_LB_PER_FT3} lb/ft³ that is ${(netOunces / OUNCES_PER_POUND / ONE_PART_FOAM_LB_PER_FT3).toFixed(3)} ft³ = ${volumeIn3.toFixed(0)} in³ cured; a 1/2 × 1/2 in bead holds 0.5 × 0.5 × 12 = 3 in³/ft; ${volumeIn3.toFixed(0)} / 3 = ${feet} ft`,
    flueSafe: false,
    source: MEMORY(
      'Cured density of one-part foam sealant about 1.5–2 lb/ft³ (makers’ data sheets, recalled); 2 lb/ft³ taken',
    ),
  };
}

/** Goods bought by the foot, the ft² or the piece: one purchase unit is one use unit. */
function byThe(
  id: MaterialId,
  name: string,
  useUnit: MaterialUseUnit,
  options: { flueSafe?: boolean; source: SourceNote },
): Material {
  const words = { linearFt: 'ft', ft2: 'ft²', each: 'each' }[useUnit];
  const purchaseUnit =
    useUnit === 'each' ? { one: 'piece', many: 'pieces' } : { one: words, many: words };
  return {
    id,
    name,
    useUnit,
    useUnitWords: words,
    purchaseUnit,
    yieldPerPurchaseUnit: 1,
    yieldWorking: `bought by the ${useUnit === 'each' ? 'piece' : words}`,
    flueSafe: options.flueSafe ?? false,
    source: options.source,
  };
}

const MASTIC_BAND_FT = beadFeetOf(CUBIC_INCHES_PER_US_GALLON, 1, 0.125);

/** Every material, by id. */
export const MATERIALS: Readonly<Record<MaterialId, Material>> = {
  'sealant-tube': sealantTube('sealant-tube', 'Sealant (caulk), 10.1 fl oz tube', false),
  'fire-rated-sealant-tube': sealantTube(
    'fire-rated-sealant-tube',
    'Fire-rated sealant, 10.1 fl oz tube',
    false,
  ),
  'high-temperature-sealant-tube': sealantTube(
    'high-temperature-sealant-tube',
    'High-temperature sealant, 10.1 fl oz tube',
    true,
  ),
  'foam-can-12oz': foamCan('foam-can-12oz', 12),
  'foam-can-24oz': foamCan('foam-can-24oz', 24),
  'foam-board-sheet': {
    id: 'foam-board-sheet',
    name: 'Rigid foam board, 4 × 8 ft sheet',
    useUnit: 'ft2',
    useUnitWords: 'ft²',
    purchaseUnit: { one: 'sheet', many: 'sheets' },
    yieldPerPurchaseUnit: 32,
    yieldWorking: '4 ft × 8 ft = 32 ft² per sheet',
    flueSafe: false,
    source: PRACTICE('Rigid board is sold in 4 × 8 ft sheets'),
  },
  weatherstrip: byThe('weatherstrip', 'Weatherstrip', 'linearFt', {
    source: PRACTICE('Weatherstrip is bought by length'),
  }),
  'door-sweep': byThe('door-sweep', 'Door sweep, 36 inch', 'each', {
    source: PRACTICE('One sweep per exterior door'),
  }),
  'outlet-gasket': byThe('outlet-gasket', 'Foam gasket for an outlet or switch plate', 'each', {
    source: PRACTICE('One gasket per cover plate'),
  }),
  'sheet-metal': byThe('sheet-metal', 'Sheet metal (flashing)', 'ft2', {
    flueSafe: true,
    source: PRACTICE('Galvanized flashing, cut to fit; bought by area'),
  }),
  'duct-mastic-pail': {
    id: 'duct-mastic-pail',
    name: 'Duct mastic, 1 gallon pail',
    useUnit: 'linearFt',
    useUnitWords: 'ft of 1-inch band',
    purchaseUnit: { one: 'pail', many: 'pails' },
    yieldPerPurchaseUnit: MASTIC_BAND_FT,
    yieldWorking: `1 gal = 231 in³; a band 1 in wide and 1/8 in thick holds 1 × 0.125 × 12 = 1.5 in³/ft; 231 / 1.5 = ${MASTIC_BAND_FT} ft`,
    flueSafe: false,
    source: PRACTICE('Mastic brushed about 1/8 inch thick over the joint'),
  },
  'backer-rod': byThe('backer-rod', 'Backer rod', 'linearFt', {
    source: PRACTICE('Foam rod pushed into gaps wider than a bead can bridge, before the sealant'),
  }),
  'recessed-light-cover': byThe(
    'recessed-light-cover',
    'Recessed-light cover, rated for the purpose',
    'each',
    { source: PRACTICE('One cover per fixture') },
  ),
  'attic-stair-cover': byThe('attic-stair-cover', 'Insulated, gasketed attic stair cover', 'each', {
    source: PRACTICE('One cover per stair'),
  }),
  'backdraft-damper': byThe('backdraft-damper', 'Backdraft damper, sized to the duct', 'each', {
    source: PRACTICE('One damper per exhaust duct'),
  }),
  'metal-dryer-duct': byThe('metal-dryer-duct', 'Rigid metal dryer duct, 4 inch', 'linearFt', {
    source: PRACTICE('Dryer duct bought by length'),
  }),
  'dryer-vent-hood': byThe('dryer-vent-hood', 'Dryer vent hood with damper', 'each', {
    source: PRACTICE('One hood per dryer vent'),
  }),
  'chimney-seal': byThe('chimney-seal', 'Top-sealing chimney damper or chimney plug', 'each', {
    flueSafe: true,
    source: PRACTICE('One per flue'),
  }),
};

/**
 * A material by id.
 *
 * @param id - a material id from {@link MATERIAL_IDS}
 * @returns the material
 */
export function materialOf(id: MaterialId): Material {
  return MATERIALS[id];
}

/** One material a measure uses, per unit of the measure (per ft, per ft², per each, per job). */
export interface MaterialUse {
  materialId: MaterialId;
  /** In the material's use unit (ft of bead, ft², each) per unit of the measure. */
  quantityPerUnit: number;
  /** Why this much, in plain words, with its mark. */
  source: SourceNote;
}

/**
 * A material use of a library entry, its quantity a trade judgement.
 *
 * @param materialId - the material
 * @param quantityPerUnit - use units per unit of the measure
 * @param why - how the quantity is reached, in plain words (e.g. the typical size assumed)
 * @returns the use, marked "common practice"
 */
export function uses(materialId: MaterialId, quantityPerUnit: number, why: string): MaterialUse {
  return { materialId, quantityPerUnit, source: PRACTICE(why) };
}
