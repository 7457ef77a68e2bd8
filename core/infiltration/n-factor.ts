/**
 * The LBL climate factor: natural infiltration as the blower-door reading divided by one
 * number, N, that folds in the climate, the height of the house and its wind shielding.
 *
 * It is the quickest estimate there is and the coarsest: it knows nothing of where the
 * leaks are or of this season's weather. The user should always be able to override N.
 */
import { MINUTES_PER_HOUR } from '../constants.ts';
import { requireAtLeast, requireNonNegative, requirePositive } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';

/** Wind shielding classes of the climate-factor table. */
export type NFactorShielding = 'wellShielded' | 'normal' | 'exposed';

/** Shelter classes of the LBL models, 1 (open) to 5 (very sheltered). */
export type ShelterClass = 1 | 2 | 3 | 4 | 5;

/** Natural infiltration as a mean flow and as air changes. */
export interface NaturalInfiltration {
  /** Mean natural air flow, cfm. */
  cfmNatural: number;
  /** Mean natural air changes, 1/h. */
  achNatural: number;
}

/** Story counts of the table's columns. */
const TABLE_STORIES = [1, 1.5, 2, 3];

/**
 * N for normal shielding, by climate zone (rows 1–4) and stories (columns 1, 1.5, 2, 3).
 * Published method: Sherman 1987, Energy and Buildings 10; the values are from memory, in a
 * common rendering of the table. Zone 1 has the smallest N, so the most natural infiltration
 * per ACH50; check the zone map before relying on the numbering.
 */
const N_NORMAL_BY_ZONE: Record<1 | 2 | 3 | 4, readonly number[]> = {
  1: [15.5, 14.0, 12.4, 10.9],
  2: [18.5, 16.7, 14.8, 13.0],
  3: [21.5, 19.4, 17.2, 15.1],
  4: [24.5, 22.1, 19.6, 17.2],
};

/**
 * Multipliers of N for shielding: a sheltered house leaks less in the same wind, so its N
 * is larger. From memory, with the table above.
 */
const SHIELDING_MULTIPLIER: Record<NFactorShielding, number> = {
  wellShielded: 1.2,
  normal: 1,
  exposed: 0.9,
};

/**
 * The climate/height/shielding factor N of the LBL method.
 *
 * @param options.zone - climate zone of the N-factor map, 1 to 4
 * @param options.stories - stories above grade; interpolated linearly between 1, 1.5, 2 and
 *   3, held at the end values outside them
 * @param options.shielding - 'wellShielded', 'normal' or 'exposed'
 * @returns N, dimensionless (ACHnat = ACH50 / N)
 *
 * Notes: N = N_normal(zone, stories) × shielding multiplier (well shielded 1.2, normal 1,
 * exposed 0.9).
 *
 * References: Sherman 1987, "Estimation of infiltration from leakage and climate
 * indicators", Energy and Buildings 10 (method); the table values are from memory.
 */
export function lblNFactor(options: {
  zone: 1 | 2 | 3 | 4;
  stories: number;
  shielding: NFactorShielding;
}): number {
  const row = N_NORMAL_BY_ZONE[options.zone];
  if (row === undefined) {
    throw InputError.at('zone', `expected a climate zone 1, 2, 3 or 4, got ${options.zone}`);
  }
  requireAtLeast('stories', options.stories, 1);
  const multiplier = SHIELDING_MULTIPLIER[options.shielding];
  if (multiplier === undefined) {
    throw InputError.at(
      'shielding',
      `expected "wellShielded", "normal" or "exposed", got ${String(options.shielding)}`,
    );
  }
  return interpolateInStories(row, options.stories) * multiplier;
}

function interpolateInStories(row: readonly number[], stories: number): number {
  const last = TABLE_STORIES.length - 1;
  if (stories >= TABLE_STORIES[last]!) return row[last]!;
  let upper = 1;
  while (TABLE_STORIES[upper]! < stories) upper++;
  const [storiesLow, storiesHigh] = [TABLE_STORIES[upper - 1]!, TABLE_STORIES[upper]!];
  const [nLow, nHigh] = [row[upper - 1]!, row[upper]!];
  return nLow + ((stories - storiesLow) / (storiesHigh - storiesLow)) * (nHigh - nLow);
}

/**
 * The shielding row of the N-factor table that an LBL shelter class falls in.
 *
 * @param shelterClass - LBL shelter class, 1 (no obstructions) to 5 (buildings or trees
 *   closer than one house height)
 * @returns 'exposed' for classes 1–2, 'normal' for 3, 'wellShielded' for 4–5
 *
 * Notes: the two scales describe the same thing in different steps; this mapping is ours
 * (Sealwork's), not a published one.
 *
 * References: shelter classes as in the ASHRAE Handbook of Fundamentals, ventilation and
 * infiltration chapter; the mapping is Sealwork's own.
 */
export function shieldingForShelterClass(shelterClass: ShelterClass): NFactorShielding {
  switch (shelterClass) {
    case 1:
    case 2:
      return 'exposed';
    case 3:
      return 'normal';
    case 4:
    case 5:
      return 'wellShielded';
    default:
      throw InputError.at(
        'shelterClass',
        `expected a shelter class 1 to 5, got ${String(shelterClass)}`,
      );
  }
}

/**
 * Natural infiltration by the LBL climate factor.
 *
 * @param options.cfm50 - flow at 50 Pa, cfm
 * @param options.volumeFt3 - conditioned volume, ft³
 * @param options.nFactor - N from {@link lblNFactor} or the user's own
 * @returns mean natural flow (cfm) and air changes (1/h)
 *
 * Notes: ACHnat = ACH50 / N, ACH50 = CFM50·60 / V; CFMnat = CFM50 / N.
 *
 * References: Sherman 1987, Energy and Buildings 10.
 */
export function nFactorInfiltration(options: {
  cfm50: number;
  volumeFt3: number;
  nFactor: number;
}): NaturalInfiltration {
  const { cfm50, volumeFt3, nFactor } = options;
  requireNonNegative('cfm50', cfm50);
  requirePositive('volumeFt3', volumeFt3);
  requirePositive('nFactor', nFactor);
  const cfmNatural = cfm50 / nFactor;
  return { cfmNatural, achNatural: (cfmNatural * MINUTES_PER_HOUR) / volumeFt3 };
}
