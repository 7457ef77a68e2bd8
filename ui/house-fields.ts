/**
 * The house geometry fields: their labels, units and choices (the House section edits them
 * through data-fields.ts). The store's own rules (homes.update) decide what is valid.
 */
import type { Foundation } from '../core/schema.ts';
import type { Quantity } from './quantities.ts';

export type HouseFieldKey =
  | 'conditionedFloorAreaFt2'
  | 'conditionedVolumeFt3'
  | 'stories'
  | 'heightFt'
  | 'bedrooms'
  | 'shelterClass'
  | 'foundation'
  | 'yearBuilt';

export interface NumberFieldSpec {
  kind: 'number';
  key: Exclude<HouseFieldKey, 'shelterClass' | 'foundation'>;
  label: string;
  /** The quantity whose unit follows the IP/SI choice; absent for counts and years. */
  quantity?: Quantity;
  /** The unit of a count, shown beside the box. */
  countUnit?: string;
  hint?: string;
}

export interface ChoiceFieldSpec {
  kind: 'choice';
  key: 'shelterClass' | 'foundation';
  label: string;
  choices: readonly { value: string; words: string }[];
  hint?: string;
}

export type HouseFieldSpec = NumberFieldSpec | ChoiceFieldSpec;

// The screens import only types from core/schema.ts: its zod schemas would probe for eval,
// which the page's Content Security Policy refuses (and reports).
const FOUNDATION_WORDS: Readonly<Record<Foundation, string>> = {
  basement: 'Basement',
  crawlspace: 'Crawlspace',
  slab: 'Slab on grade',
};
const FOUNDATIONS = Object.keys(FOUNDATION_WORDS) as Foundation[];

/** Shelter classes as the LBL infiltration model describes them (ASHRAE HoF, from memory). */
const SHELTER_WORDS = [
  '1: open, no shielding',
  '2: light shielding',
  '3: moderate shielding',
  '4: heavy shielding',
  '5: very heavy shielding',
] as const;

export const HOUSE_FIELDS: readonly HouseFieldSpec[] = [
  { kind: 'number', key: 'conditionedFloorAreaFt2', label: 'Floor area', quantity: 'areaFt2' },
  { kind: 'number', key: 'conditionedVolumeFt3', label: 'Volume', quantity: 'volumeFt3' },
  { kind: 'number', key: 'stories', label: 'Stories', countUnit: 'stories' },
  {
    kind: 'number',
    key: 'heightFt',
    label: 'Height',
    quantity: 'lengthFt',
    hint: 'Of the pressure boundary, from the lowest leak to the highest',
  },
  { kind: 'number', key: 'bedrooms', label: 'Bedrooms', countUnit: 'bedrooms' },
  {
    kind: 'choice',
    key: 'shelterClass',
    label: 'Shelter class',
    choices: SHELTER_WORDS.map((words, index) => ({ value: String(index + 1), words })),
  },
  {
    kind: 'choice',
    key: 'foundation',
    label: 'Foundation',
    choices: FOUNDATIONS.map((value) => ({ value, words: FOUNDATION_WORDS[value] })),
  },
  { kind: 'number', key: 'yearBuilt', label: 'Year built' },
];

/** Foundation words for the read-only views. */
export function foundationWords(foundation: Foundation): string {
  return FOUNDATION_WORDS[foundation];
}
