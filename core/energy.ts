/**
 * Seasonal energy of an air flow: the heat carried out (heating) or brought in (cooling) by
 * infiltration over a season of degree days, and what it costs the equipment in fuel,
 * site energy and CO2.
 */
import { airHeatCapacityBtuPerFt3F, pressureRatioAtElevation } from './air.ts';
import {
  AIR_LATENT_BTU_PER_HOUR_CFM_GRAIN,
  BTU_PER_KWH,
  BTU_PER_MMBTU,
  HOURS_PER_DAY,
  MINUTES_PER_HOUR,
} from './constants.ts';
import { InputError } from './errors.ts';
import { FUEL_FACTS } from './fuels.ts';
import type { Climate, Cooling, Fuel, Heating } from './schema.ts';

/**
 * Mean air flows over the heating and the cooling season, cfm. Each mean is weighted as its
 * load is summed: by the hours' degrees below (or above) the base, and for the latent load by
 * the hours' humidity excess. With one flow a season (degree days) the latent flow is the
 * cooling flow; hour by hour it is its own mean (`coolingLatentCfm`).
 */
export interface SeasonalAirflowCfm {
  heatingCfm: number;
  coolingCfm: number;
  coolingLatentCfm?: number;
}

/**
 * What a year's loads are summed over: degree days at the base the loads start from, the
 * cooling hours' humidity excess, and the site's elevation (thinner air holds less heat).
 */
export interface SeasonTotals {
  heatingDegreeDaysF: number;
  coolingDegreeDaysF: number;
  /** Σ over cooling hours of (W_out − W_in)⁺, grain/lb · h. */
  latentGrainHours: number;
  elevationFt: number;
}

/** A climate's season totals: its degree days at 65 °F and its cooling season's latent hours. */
export function seasonTotalsOfClimate(
  climate: Pick<Climate, 'hdd65F' | 'cdd65F' | 'elevationFt' | 'coolingSeason'>,
): SeasonTotals {
  return {
    heatingDegreeDaysF: climate.hdd65F,
    coolingDegreeDaysF: climate.cdd65F,
    latentGrainHours: climate.coolingSeason?.latentGrainHours ?? 0,
    elevationFt: climate.elevationFt,
  };
}

/** The energy an air flow costs in a year, in the units the household pays for. */
export interface AnnualEnergy {
  heatingLoadBtu: number;
  coolingLoadBtu: number;
  /** Heating fuel bought, in the fuel's customary unit (therm, gallon, kWh, …). */
  heatingFuelUnits: number;
  /** Cooling electricity, kWh. */
  coolingKwh: number;
  /** Electricity of mechanical ventilation fans beyond those the house already runs, kWh. */
  ventilationFanKwh: number;
  /** Site energy bought (heating fuel + cooling electricity), MMBtu. */
  siteMMBtu: number;
  /** CO2 of that energy, kg (electricity at the grid factor given; 0 when none is given). */
  co2Kg: number;
}

/** The parts of a home the energy calculation needs. */
export interface EnergyContext {
  seasons: SeasonTotals;
  heating: Pick<Heating, 'fuel' | 'equipment' | 'efficiency' | 'distributionEfficiency'>;
  cooling: Pick<Cooling, 'seer' | 'distributionEfficiency'> | null;
  /** Grid CO2 factor, kg/kWh; 0 when unknown. */
  electricityKgCo2PerKwh: number;
}

/**
 * Sensible heat an air flow carries over a season of degree days.
 *
 * @param options.airflowCfm - mean air flow over the season, cfm
 * @param options.degreeDaysF - heating or cooling degree days, °F·day
 * @param options.elevationFt - site elevation, ft (air is thinner and holds less heat)
 * @returns heat, Btu
 *
 * Notes: Q = ρ·cp·V̇·ΔT summed over the season = 0.018·(p/p₀) Btu/(ft³·°F) × cfm × 60 min/h
 * × 24 h/day × DD, i.e. 1.08·cfm·24·DD at sea level.
 *
 * References: ASHRAE Handbook of Fundamentals, load calculation chapters (1.08 factor);
 * ASHRAE HoF 2017 ch. 1 eq. 3 (standard atmosphere).
 */
export function seasonalSensibleLoadBtu(options: {
  airflowCfm: number;
  degreeDaysF: number;
  elevationFt: number;
}): number {
  const { airflowCfm, degreeDaysF, elevationFt } = options;
  return (
    airHeatCapacityBtuPerFt3F(elevationFt) *
    airflowCfm *
    MINUTES_PER_HOUR *
    HOURS_PER_DAY *
    degreeDaysF
  );
}

/**
 * Latent (moisture) load an air flow brings in over a cooling season.
 *
 * @param options.airflowCfm - mean air flow over the cooling season, cfm
 * @param options.latentGrainHours - Σ over cooling hours of (W_out − W_in)⁺, grain/lb·h
 * @param options.elevationFt - site elevation, ft
 * @returns latent heat, Btu
 *
 * Notes: q = 0.68·cfm·Δgr Btu/h at sea level, scaled by p/p₀ like the sensible factor.
 *
 * References: ASHRAE Handbook of Fundamentals, load calculation chapter (0.68 factor, from
 * memory).
 */
export function seasonalLatentLoadBtu(options: {
  airflowCfm: number;
  latentGrainHours: number;
  elevationFt: number;
}): number {
  const { airflowCfm, latentGrainHours, elevationFt } = options;
  return (
    AIR_LATENT_BTU_PER_HOUR_CFM_GRAIN *
    pressureRatioAtElevation(elevationFt) *
    airflowCfm *
    latentGrainHours
  );
}

/**
 * Heating fuel bought to meet a heating load.
 *
 * @param loadBtu - heat delivered to the house, Btu
 * @param heating - fuel, equipment and efficiency (AFUE or COP as a fraction; HSPF in Btu/Wh
 *   for a heat pump) and distribution efficiency (default 1)
 * @returns fuel in its customary unit (therm, gallon, kWh, …)
 *
 * Notes: input = load / (efficiency · η_dist); a heat pump's electricity is load /
 * (HSPF · η_dist) Wh. Supplementary resistance heat is not modelled separately; it is part of
 * the seasonal HSPF.
 *
 * References: 10 CFR 430 subpart B, appendices N (AFUE) and M/M1 (HSPF) for the definitions.
 */
export function heatingFuelUnitsForLoad(
  loadBtu: number,
  heating: EnergyContext['heating'],
): number {
  const distribution = heating.distributionEfficiency ?? 1;
  if (heating.equipment === 'heatPump') {
    const wattHours = loadBtu / (heating.efficiency * distribution);
    return wattHours / 1000;
  }
  const inputBtu = loadBtu / (heating.efficiency * distribution);
  return inputBtu / FUEL_FACTS[heating.fuel].btuPerUnit;
}

/**
 * Cooling electricity for a cooling load.
 *
 * @param loadBtu - heat removed, Btu
 * @param cooling - SEER (Btu/Wh) and distribution efficiency (default 1)
 * @returns kWh
 *
 * References: 10 CFR 430 subpart B, appendix M/M1 (SEER as seasonal Btu per Wh).
 */
export function coolingKwhForLoad(
  loadBtu: number,
  cooling: NonNullable<EnergyContext['cooling']>,
): number {
  const distribution = cooling.distributionEfficiency ?? 1;
  return loadBtu / (cooling.seer * distribution) / 1000;
}

/** CO2 of buying `units` of `fuel`, kg. */
function co2KgOf(fuel: Fuel, units: number, electricityKgCo2PerKwh: number): number {
  const facts = FUEL_FACTS[fuel];
  if (facts.co2KgPerMMBtu === null) return units * electricityKgCo2PerKwh;
  return ((units * facts.btuPerUnit) / BTU_PER_MMBTU) * facts.co2KgPerMMBtu;
}

/**
 * The year's energy for seasonal air flows through a home's equipment.
 *
 * @param context - climate, heating and cooling equipment, grid CO2 factor
 * @param airflow - mean heating- and cooling-season air flows, cfm
 * @param ventilationFanKwh - electricity of fans moving part of that air, kWh (default 0)
 * @returns loads, fuel and electricity bought, site MMBtu and CO2
 */
export function annualEnergyOfAirflow(
  context: EnergyContext,
  airflow: SeasonalAirflowCfm,
  ventilationFanKwh = 0,
): AnnualEnergy {
  if (!(airflow.heatingCfm >= 0) || !(airflow.coolingCfm >= 0)) {
    throw InputError.at('airflow', 'expected air flows of at least 0 cfm');
  }
  const { seasons, heating, cooling } = context;
  const heatingLoadBtu = seasonalSensibleLoadBtu({
    airflowCfm: airflow.heatingCfm,
    degreeDaysF: seasons.heatingDegreeDaysF,
    elevationFt: seasons.elevationFt,
  });
  let coolingLoadBtu = 0;
  let coolingKwh = 0;
  if (cooling) {
    coolingLoadBtu = seasonalSensibleLoadBtu({
      airflowCfm: airflow.coolingCfm,
      degreeDaysF: seasons.coolingDegreeDaysF,
      elevationFt: seasons.elevationFt,
    });
    coolingLoadBtu += seasonalLatentLoadBtu({
      airflowCfm: airflow.coolingLatentCfm ?? airflow.coolingCfm,
      latentGrainHours: seasons.latentGrainHours,
      elevationFt: seasons.elevationFt,
    });
    coolingKwh = coolingKwhForLoad(coolingLoadBtu, cooling);
  }
  const heatingFuelUnits = heatingFuelUnitsForLoad(heatingLoadBtu, heating);
  const heatingSiteBtu = heatingFuelUnits * FUEL_FACTS[heating.fuel].btuPerUnit;
  const electricKwh = coolingKwh + ventilationFanKwh;
  return {
    heatingLoadBtu,
    coolingLoadBtu,
    heatingFuelUnits,
    coolingKwh,
    ventilationFanKwh,
    siteMMBtu: (heatingSiteBtu + electricKwh * BTU_PER_KWH) / BTU_PER_MMBTU,
    co2Kg:
      co2KgOf(heating.fuel, heatingFuelUnits, context.electricityKgCo2PerKwh) +
      electricKwh * context.electricityKgCo2PerKwh,
  };
}

/** The energy saved going from one year's energy to another's (before − after). */
export function energySaved(before: AnnualEnergy, after: AnnualEnergy): AnnualEnergy {
  return {
    heatingLoadBtu: before.heatingLoadBtu - after.heatingLoadBtu,
    coolingLoadBtu: before.coolingLoadBtu - after.coolingLoadBtu,
    heatingFuelUnits: before.heatingFuelUnits - after.heatingFuelUnits,
    coolingKwh: before.coolingKwh - after.coolingKwh,
    ventilationFanKwh: before.ventilationFanKwh - after.ventilationFanKwh,
    siteMMBtu: before.siteMMBtu - after.siteMMBtu,
    co2Kg: before.co2Kg - after.co2Kg,
  };
}
