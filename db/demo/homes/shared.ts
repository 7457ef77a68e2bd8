/**
 * What every demo home shares. All of it is invented for the demo scenario: the county, its
 * towns, the climate called "Alder Creek, demo", the fuel prices, the crew rate and markup.
 * None of it describes a real place, program or market, and no test uses it as an expected
 * value.
 */
import type { HomeFileInput, Range } from '../../../core/schema.ts';

/** The invented county the program serves; the word "fictional" travels with every address. */
export const DEMO_REGION = 'Wrenfield County (fictional)';

/** The program's three invented towns. */
export const DEMO_TOWNS = {
  alderCreek: 'Alder Creek',
  petrelFord: 'Petrel Ford',
  stonecrop: 'Stonecrop',
} as const;

/** An invented cold-temperate climate. */
export const ALDER_CREEK_CLIMATE = {
  name: 'Alder Creek, demo',
  hdd65F: 6400,
  cdd65F: 650,
  elevationFt: 1150,
  nFactorZone: 2,
  wsf: 0.56,
  heatingSeason: { meanDeltaTF: 36, meanWindSpeedMph: 9.5 },
  coolingSeason: { meanDeltaTF: 8, meanWindSpeedMph: 7, latentGrainHours: 9000 },
} as const;

/**
 * Invented prices of the demo county, with invented real escalation: natural gas per therm,
 * propane, oil and kerosene per gallon, electricity per kWh, wood per cord, pellets per ton.
 */
export const PRICES = {
  naturalGas: { usdPerUnit: 1.42, escalationRateReal: 0.01 },
  propane: { usdPerUnit: 2.95, escalationRateReal: 0.01 },
  heatingOil: { usdPerUnit: 3.85, escalationRateReal: 0.015 },
  kerosene: { usdPerUnit: 4.1, escalationRateReal: 0.015 },
  electricity: { usdPerUnit: 0.168, escalationRateReal: 0.005 },
  wood: { usdPerUnit: 265, escalationRateReal: 0.005 },
  pellets: { usdPerUnit: 330, escalationRateReal: 0.005 },
} as const;

export const ECONOMICS = { discountRateReal: 0.03, ranking: 'sir' } as const;

/** An invented grid factor for the demo county. */
export const EMISSIONS = { electricityKgCo2PerKwh: 0.42 } as const;

/** The program's invented crew rate, USD per hour. */
const CREW_RATE_USD_PER_HOUR = 58;

/** The program's invented markup on materials and labour. */
const CREW_MARKUP_FRACTION = 0.15;

type Cost = HomeFileInput['measures'][number]['cost'];

/**
 * A measure's cost at the program's invented crew rate and markup.
 *
 * @param materialsUsd - materials, USD
 * @param laborHours - crew hours, h
 * @param healthAndSafety - true when the work is paid from the health-and-safety budget
 * @returns the cost line items of a home file measure
 */
export function crewCost(materialsUsd: number, laborHours: number, healthAndSafety = false): Cost {
  return {
    materialsUsd,
    laborHours,
    laborRateUsdPerHour: CREW_RATE_USD_PER_HOUR,
    markupFraction: CREW_MARKUP_FRACTION,
    ...(healthAndSafety ? { healthAndSafety } : {}),
  };
}

/**
 * A low / likely / high estimate, written in that order.
 *
 * @param low - the low end, in the unit of the field it fills (CFM50, a share, in²)
 * @param likely - the most likely value, same unit
 * @param high - the high end, same unit
 * @returns the range
 */
export function range(low: number, likely: number, high: number): Range {
  return { low, likely, high };
}

/**
 * A demo home's address in one of the invented towns.
 *
 * @param street - house number and an invented street
 * @param town - one of the invented towns
 * @returns the address of a home file
 */
export function demoAddress(street: string, town: string): NonNullable<HomeFileInput['address']> {
  return { street, town, region: DEMO_REGION };
}

/**
 * The notes of a demo home: a plain statement that it is invented, then the auditor's notes.
 *
 * @param auditorNotes - what the invented auditor wrote about the house
 * @returns the home file's notes
 */
export function demoNotes(auditorNotes: string): string {
  return `Invented demo home of the fictional Alder Creek Home Repair Program; the house, its client and every figure are made up. ${auditorNotes}`;
}
