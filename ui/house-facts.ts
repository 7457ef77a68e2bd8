/**
 * The parts of a home the House section shows but does not edit yet (climate, equipment,
 * prices), as term and value pairs with their units.
 */
import { formatNumber, formatUsd } from '../core/format.ts';
import { fuelFacts } from '../core/fuels.ts';
import type { Fuel, HeatingEquipment, HomeData } from '../core/schema.ts';
import { fahrenheitDifferenceToKelvin } from '../core/units.ts';
import { fuelWords } from './labels.ts';
import { formatQuantity, type UnitSystem } from './quantities.ts';

export interface Fact {
  term: string;
  value: string;
}

const EQUIPMENT_WORDS: Readonly<Record<HeatingEquipment, string>> = {
  furnace: 'Furnace',
  boiler: 'Boiler',
  heatPump: 'Heat pump',
  electricResistance: 'Electric resistance',
  stove: 'Stove',
};

/** The fuels in the order prices are listed (types only from core/schema.ts: see house-fields.ts). */
const FUEL_ORDER: readonly Fuel[] = [
  'naturalGas',
  'propane',
  'heatingOil',
  'kerosene',
  'electricity',
  'wood',
  'pellets',
];

const VENTING_WORDS: Readonly<Record<string, string>> = {
  naturalDraft: 'Natural draft',
  inducedDraft: 'Induced draft',
  sealed: 'Sealed combustion',
  none: 'Not vented',
};

function percent(fraction: number): string {
  return `${formatNumber(fraction * 100, 0)} %`;
}

function degreeDays(valueF: number, units: UnitSystem): string {
  return units === 'IP'
    ? `${formatNumber(valueF)} °F·day`
    : `${formatNumber(fahrenheitDifferenceToKelvin(valueF))} K·day`;
}

/** The climate's figures, or null when the home has none of its own. */
export function climateFacts(data: HomeData, units: UnitSystem): Fact[] | null {
  const climate = data.climate;
  if (climate === undefined) return null;
  return [
    { term: 'Climate', value: climate.name },
    { term: 'Heating degree days (65 °F base)', value: degreeDays(climate.hdd65F, units) },
    { term: 'Cooling degree days (65 °F base)', value: degreeDays(climate.cdd65F, units) },
    { term: 'Elevation', value: formatQuantity('lengthFt', climate.elevationFt, units) },
  ];
}

/** Heating and cooling equipment, or null when neither is recorded. */
export function equipmentFacts(data: HomeData): Fact[] | null {
  const { heating, cooling } = data;
  if (heating === undefined && cooling === undefined) return null;
  const facts: Fact[] = [];
  if (heating !== undefined) {
    facts.push({
      term: 'Heating',
      value: `${EQUIPMENT_WORDS[heating.equipment]}, ${fuelWords(heating.fuel).toLowerCase()}`,
    });
    if (heating.equipment === 'heatPump') {
      facts.push({ term: 'HSPF', value: `${formatNumber(heating.efficiency, 1)} Btu/Wh` });
    } else if (heating.equipment === 'furnace' || heating.equipment === 'boiler') {
      facts.push({ term: 'AFUE', value: percent(heating.efficiency) });
    } else {
      facts.push({ term: 'Efficiency', value: percent(heating.efficiency) });
    }
    if (heating.distributionEfficiency !== undefined) {
      facts.push({
        term: 'Distribution efficiency',
        value: percent(heating.distributionEfficiency),
      });
    }
    if (heating.combustionVenting !== undefined) {
      facts.push({
        term: 'Venting',
        value: VENTING_WORDS[heating.combustionVenting] ?? heating.combustionVenting,
      });
    }
  }
  facts.push({
    term: 'Cooling',
    value: cooling ? `SEER ${formatNumber(cooling.seer, 1)} Btu/Wh` : 'None',
  });
  return facts;
}

/** The price of each fuel the home has one for, per the unit it is bought in. */
export function priceFacts(data: HomeData): Fact[] | null {
  const prices = data.prices;
  if (prices === undefined) return null;
  return FUEL_ORDER.flatMap((fuel) => {
    const price = prices[fuel];
    if (price === undefined) return [];
    const escalation =
      price.escalationRateReal === undefined
        ? ''
        : `, ${formatNumber(price.escalationRateReal * 100, 1)} %/yr real`;
    return [
      {
        term: fuelWords(fuel),
        value: `${formatUsd(price.usdPerUnit, { cents: true })} per ${fuelFacts(fuel).unit}${escalation}`,
      },
    ];
  });
}
