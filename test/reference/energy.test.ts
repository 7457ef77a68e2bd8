/**
 * Seasonal energy of infiltration against the trade's published factors and the definitions
 * of the equipment ratings. Each check names its source beside it.
 */
import { describe, expect, it } from 'vitest';
import {
  annualEnergyOfAirflow,
  coolingKwhForLoad,
  heatingFuelUnitsForLoad,
  seasonalLatentLoadBtu,
  seasonalSensibleLoadBtu,
  type EnergyContext,
} from '../../core/energy.ts';
import { FUEL_FACTS } from '../../core/fuels.ts';

describe('seasonal sensible load', () => {
  it('is 1.08 Btu/(h·cfm·°F) × 24 h × degree days at sea level', () => {
    // ASHRAE Handbook of Fundamentals, load calculation chapters: q = 1.08·cfm·ΔT (Btu/h).
    const loadBtu = seasonalSensibleLoadBtu({ airflowCfm: 100, degreeDaysF: 5000, elevationFt: 0 });
    expect(loadBtu).toBeCloseTo(1.08 * 100 * 24 * 5000, 6);
  });

  it('follows the air heat capacity of the Washington State Energy Code at altitude', () => {
    // WAC 51-11C tabulates 0.0168 Btu/(ft³·°F) at 2000 ft and 0.0162 at 3000 ft, printed to
    // four decimals; the standard atmosphere agrees within one unit of that last digit.
    for (const [elevationFt, tabulated] of [
      [2000, 0.0168],
      [3000, 0.0162],
    ] as const) {
      const perCfmDegreeDay = seasonalSensibleLoadBtu({
        airflowCfm: 1,
        degreeDaysF: 1,
        elevationFt,
      });
      expect(Math.abs(perCfmDegreeDay / (60 * 24) - tabulated)).toBeLessThanOrEqual(0.0001);
    }
  });

  it('is zero with no degree days or no air', () => {
    expect(seasonalSensibleLoadBtu({ airflowCfm: 0, degreeDaysF: 6000, elevationFt: 0 })).toBe(0);
    expect(seasonalSensibleLoadBtu({ airflowCfm: 80, degreeDaysF: 0, elevationFt: 0 })).toBe(0);
  });
});

describe('latent cooling load', () => {
  it('is 0.68 Btu/(h·cfm·gr/lb) at sea level', () => {
    // ASHRAE HoF load calculation chapter, q_l = 0.68·cfm·Δgr (constant from memory).
    expect(
      seasonalLatentLoadBtu({ airflowCfm: 50, latentGrainHours: 10_000, elevationFt: 0 }),
    ).toBeCloseTo(0.68 * 50 * 10_000, 6);
  });
});

describe('equipment', () => {
  it('turns a furnace load into therms by AFUE and distribution efficiency', () => {
    // 10 CFR 430 subpart B appendix N: AFUE is heat delivered ÷ fuel energy in, seasonally;
    // EIA: 100,000 Btu per therm.
    const therms = heatingFuelUnitsForLoad(8_000_000, {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.8,
      distributionEfficiency: 0.8,
    });
    expect(therms).toBeCloseTo(8_000_000 / (0.8 * 0.8) / 100_000, 9);
  });

  it('turns a heat pump load into kWh by HSPF (Btu per Wh)', () => {
    // 10 CFR 430 subpart B appendix M: HSPF is seasonal heat delivered (Btu) per Wh used.
    const kwh = heatingFuelUnitsForLoad(6_800_000, {
      fuel: 'electricity',
      equipment: 'heatPump',
      efficiency: 8.5,
    });
    expect(kwh).toBeCloseTo(6_800_000 / 8.5 / 1000, 9);
  });

  it('turns electric resistance heat into kWh at 3,412 Btu/kWh', () => {
    // U.S. EIA, "British thermal units (Btu)": 1 kWh = 3,412 Btu.
    const kwh = heatingFuelUnitsForLoad(3_412_000, {
      fuel: 'electricity',
      equipment: 'electricResistance',
      efficiency: 1,
    });
    expect(kwh).toBeCloseTo(1000, 9);
  });

  it('turns an oil boiler load into gallons at 138,500 Btu/gal', () => {
    // U.S. EIA: No. 2 heating oil 138,500 Btu per gallon.
    const gallons = heatingFuelUnitsForLoad(10_000_000, {
      fuel: 'heatingOil',
      equipment: 'boiler',
      efficiency: 0.8,
    });
    expect(gallons).toBeCloseTo(10_000_000 / 0.8 / 138_500, 9);
  });

  it('turns a cooling load into kWh by SEER (Btu per Wh)', () => {
    // 10 CFR 430 subpart B appendix M: SEER is seasonal cooling (Btu) per Wh used.
    expect(coolingKwhForLoad(1_300_000, { seer: 13, distributionEfficiency: 0.9 })).toBeCloseTo(
      1_300_000 / (13 * 0.9) / 1000,
      9,
    );
  });
});

describe('a year of infiltration', () => {
  const context: EnergyContext = {
    seasons: {
      heatingDegreeDaysF: 6000,
      coolingDegreeDaysF: 1000,
      latentGrainHours: 0,
      elevationFt: 0,
    },
    heating: { fuel: 'naturalGas', equipment: 'furnace', efficiency: 0.9 },
    cooling: { seer: 14 },
    electricityKgCo2PerKwh: 0.4,
  };

  it('adds heating fuel, cooling and fan electricity into site MMBtu and CO2', () => {
    const energy = annualEnergyOfAirflow(context, { heatingCfm: 100, coolingCfm: 60 }, 200);
    const heatingLoad = 1.08 * 100 * 24 * 6000; // ASHRAE HoF 1.08 factor, sea level
    const coolingLoad = 1.08 * 60 * 24 * 1000;
    const therms = heatingLoad / 0.9 / 100_000; // EIA 100,000 Btu/therm
    const coolingKwh = coolingLoad / 14 / 1000; // SEER definition
    expect(energy.heatingFuelUnits).toBeCloseTo(therms, 9);
    expect(energy.coolingKwh).toBeCloseTo(coolingKwh, 9);
    expect(energy.siteMMBtu).toBeCloseTo((therms * 100_000 + (coolingKwh + 200) * 3412) / 1e6, 9);
    // EIA CO2 coefficient for natural gas, 53.06 kg/MMBtu; the grid factor as given.
    expect(energy.co2Kg).toBeCloseTo(therms * 0.1 * 53.06 + (coolingKwh + 200) * 0.4, 9);
  });

  it('has no cooling without an air conditioner', () => {
    const energy = annualEnergyOfAirflow(
      { ...context, cooling: null },
      { heatingCfm: 100, coolingCfm: 60 },
    );
    expect(energy.coolingKwh).toBe(0);
    expect(energy.coolingLoadBtu).toBe(0);
  });

  it('rejects a negative air flow, naming it', () => {
    expect(() => annualEnergyOfAirflow(context, { heatingCfm: -1, coolingCfm: 0 })).toThrow(
      /airflow/,
    );
  });
});

describe('fuels', () => {
  const KG_PER_LB = 0.45359237; // exact by definition (NIST SP 811)

  it('carry the EIA heat contents', () => {
    // U.S. EIA, "British thermal units (Btu)", Energy Explained.
    expect(FUEL_FACTS.naturalGas.btuPerUnit).toBe(100_000);
    expect(FUEL_FACTS.heatingOil.btuPerUnit).toBe(138_500);
    expect(FUEL_FACTS.propane.btuPerUnit).toBe(91_452);
    expect(FUEL_FACTS.electricity.btuPerUnit).toBe(3_412);
    expect(FUEL_FACTS.wood.btuPerUnit).toBe(20_000_000);
  });

  it('carry the EIA CO2 coefficients, published in lb/MMBtu', () => {
    // U.S. EIA, "Carbon Dioxide Emissions Coefficients": natural gas 117.0, propane 139.0,
    // distillate (heating oil) 161.3, kerosene 159.4 lb CO2 per MMBtu.
    expect(FUEL_FACTS.naturalGas.co2KgPerMMBtu).toBeCloseTo(117.0 * KG_PER_LB, 1);
    expect(FUEL_FACTS.propane.co2KgPerMMBtu).toBeCloseTo(139.0 * KG_PER_LB, 1);
    expect(FUEL_FACTS.heatingOil.co2KgPerMMBtu).toBeCloseTo(161.3 * KG_PER_LB, 1);
    expect(FUEL_FACTS.kerosene.co2KgPerMMBtu).toBeCloseTo(159.4 * KG_PER_LB, 1);
    expect(FUEL_FACTS.electricity.co2KgPerMMBtu).toBeNull();
  });
});
