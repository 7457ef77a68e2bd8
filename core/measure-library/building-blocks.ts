/**
 * What the group files write their entries with: the range constructor, the conversions that
 * carry a published size in cm² into our in², and the source notes many entries share.
 */
import { METERS_PER_FOOT, SQUARE_CM_PER_SQUARE_INCH } from '../constants.ts';
import type { Range } from '../schema.ts';
import type { SourceNote } from './types.ts';

/**
 * A low / likely / high estimate, written in that order.
 *
 * @param low - the low end, in the unit of the field it fills
 * @param likely - the most likely value, same unit
 * @param high - the high end, same unit
 * @returns the range
 */
export function range(low: number, likely: number, high: number): Range {
  return { low, likely, high };
}

/**
 * cm² (per item) → in². Exact conversion (NIST SP 811).
 *
 * @param areaCm2 - area, cm²
 * @returns area, in²
 *
 * Notes: in² = cm² / 6.4516.
 *
 * References: NIST SP 811, conversion factors.
 */
export function in2FromCm2(areaCm2: number): number {
  return areaCm2 / SQUARE_CM_PER_SQUARE_INCH;
}

/**
 * cm² per metre of joint → in² per foot. Exact conversion (NIST SP 811).
 *
 * @param areaCm2PerM - area per length of joint, cm²/m
 * @returns area per length of joint, in²/ft
 *
 * Notes: in²/ft = (cm²/m) × 0.3048 m/ft / 6.4516 cm²/in².
 *
 * References: NIST SP 811, conversion factors.
 */
export function in2PerFtFromCm2PerM(areaCm2PerM: number): number {
  return (areaCm2PerM * METERS_PER_FOOT) / SQUARE_CM_PER_SQUARE_INCH;
}

const NIST_LIBRARY =
  'NIST multizone modeling website, CONTAM libraries, Appendix C2 "Miscellaneous Residential Leakage Data" (RESMISC.lb3), ELA at 4 Pa';

/**
 * A size taken from the NIST residential library: low = its tight value, likely = typical.
 *
 * @param element - the library's element, as it names it
 * @param tight - its tight value, with unit, as printed
 * @param typical - its typical value, with unit, as printed
 * @returns a "published" note citing the library
 */
export function nistNote(element: string, tight: string, typical: string): SourceNote {
  return {
    mark: 'published',
    citation: `${NIST_LIBRARY}: ${element}, tight ${tight}, typical ${typical}; low = tight, likely = typical, converted to inches; the high value is our allowance for poor condition (from memory, not in the source)`,
  };
}

/**
 * A note for a value recalled, not checked against its source.
 *
 * @param citation - what the value is and where it was recalled from
 * @returns a "from memory" note
 */
export function memory(citation: string): SourceNote {
  return { mark: 'from memory', citation };
}

/**
 * A note for a trade judgement with no single source.
 *
 * @param citation - the judgement, in plain words
 * @returns a "common practice" note
 */
export function practice(citation: string): SourceNote {
  return { mark: 'common practice', citation };
}

/**
 * The life note of an entry: the program tables' span, then the years taken for this work.
 *
 * @param years - the years chosen for this work, and why, in words
 * @returns a "from memory" note
 */
export function lifeFromMemory(years: string): SourceNote {
  return memory(
    `Weatherization and efficiency-program measure-life tables list air sealing at about 10–20 years; ${years} for this work (recalled, not checked against a table)`,
  );
}

/** Every entry's cost is the invented demo scenario's. */
export const COST_DEMO: SourceNote = {
  mark: 'demo default',
  citation:
    'Invented Alder Creek demo scenario prices and crew hours; replace with the program’s own',
};

/** How much the work removes, by how it closes the leak: rigid blocking, sealant, moving parts. */
export const EFFECT_RIGID = practice(
  'Holes blocked with rigid material and sealed edges close nearly all of the opening; the range allows for hidden paths left open',
);
export const EFFECT_SEALANT = practice(
  'Caulk, foam or gaskets on a visible crack or hole remove most of it; the range allows for missed lengths and poor access',
);
export const EFFECT_MOVING = practice(
  'Weatherstripping and seals at moving parts remove part of the leak; fit and wear limit it',
);
