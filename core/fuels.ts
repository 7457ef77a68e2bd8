/**
 * Fuels: the customary unit each is bought in, its heat content and its CO2 per MMBtu.
 */
import type { Fuel } from './schema.ts';

export interface FuelFacts {
  /** The unit prices are quoted in. */
  unit: 'therm' | 'gallon' | 'kWh' | 'cord' | 'ton';
  /** Heat content of one unit, Btu (higher heating value). */
  btuPerUnit: number;
  /**
   * CO2 from burning it, kg per MMBtu of heat content; null for electricity, whose emissions
   * depend on the grid and are given by the user.
   */
  co2KgPerMMBtu: number | null;
  /** Where the figures come from. */
  source: string;
}

/**
 * Heat contents: U.S. EIA, "British thermal units (Btu)", Energy Explained (natural gas
 * 100,000 Btu/therm; No. 2 heating oil 138,500 Btu/gal; propane 91,452 Btu/gal; electricity
 * 3,412 Btu/kWh; a cord of wood about 20 MMBtu). CO2: U.S. EIA, "Carbon Dioxide Emissions
 * Coefficients" (natural gas 53.06, propane 63.07, distillate heating oil 73.16, kerosene
 * 72.30 kg/MMBtu).
 */
export const FUEL_FACTS: Readonly<Record<Fuel, FuelFacts>> = {
  naturalGas: {
    unit: 'therm',
    btuPerUnit: 100_000,
    co2KgPerMMBtu: 53.06,
    source: 'U.S. EIA Btu heat contents; EIA CO2 emission coefficients',
  },
  propane: {
    unit: 'gallon',
    btuPerUnit: 91_452,
    co2KgPerMMBtu: 63.07,
    source: 'U.S. EIA Btu heat contents; EIA CO2 emission coefficients',
  },
  heatingOil: {
    unit: 'gallon',
    btuPerUnit: 138_500,
    co2KgPerMMBtu: 73.16,
    source: 'U.S. EIA Btu heat contents (No. 2 heating oil); EIA CO2 emission coefficients',
  },
  kerosene: {
    unit: 'gallon',
    btuPerUnit: 135_000,
    co2KgPerMMBtu: 72.3,
    source: 'Heat content 135,000 Btu/gal from memory (U.S. EIA); CO2 EIA coefficients',
  },
  electricity: {
    unit: 'kWh',
    btuPerUnit: 3_412,
    co2KgPerMMBtu: null,
    source: 'U.S. EIA Btu heat contents; CO2 from the grid factor the user gives',
  },
  wood: {
    unit: 'cord',
    btuPerUnit: 20_000_000,
    co2KgPerMMBtu: 93.8,
    source:
      'U.S. EIA (about 20 MMBtu per cord); CO2 93.80 kg/MMBtu from memory (EPA GHG Emission Factors Hub, wood; biogenic)',
  },
  pellets: {
    unit: 'ton',
    btuPerUnit: 16_500_000,
    co2KgPerMMBtu: 93.8,
    source:
      'Heat content 16.5 MMBtu/ton from memory (U.S. EIA heating fuel comparison); CO2 as wood, from memory (biogenic)',
  },
};

/** The heat content and emissions of a fuel. */
export function fuelFacts(fuel: Fuel): FuelFacts {
  return FUEL_FACTS[fuel];
}
