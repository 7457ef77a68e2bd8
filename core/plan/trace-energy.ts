/**
 * The energy lines of a measure's trace: the heating load and fuel the step saves, then its
 * cooling (trace-cooling.ts), ventilation fan electricity, site energy and CO2, after the air
 * lines (trace-air.ts) they are worked from.
 */
import { HOURS_PER_YEAR } from '../constants.ts';
import { FUEL_FACTS } from '../fuels.ts';
import { DEFAULT_FAN_WATTS_PER_CFM } from '../home-model.ts';
import type { HeatingEquipment } from '../schema.ts';
import { airflowLine, fanLine, pressureLine, sensibleLine } from './trace-air.ts';
import { coolingLines } from './trace-cooling.ts';
import {
  airflow,
  electricTerm,
  figure,
  FUEL_NAMES,
  input,
  type TraceContext,
  type TraceLine,
} from './trace-parts.ts';

const EFFICIENCY_WORDS: Readonly<Record<HeatingEquipment, string>> = {
  furnace: 'Furnace efficiency (AFUE) η',
  boiler: 'Boiler efficiency (AFUE) η',
  heatPump: 'Heat pump HSPF',
  electricResistance: 'Efficiency of resistance heat η',
  stove: 'Stove seasonal efficiency η',
};

function heatingFuelLine(context: TraceContext): TraceLine {
  const { heating } = context.evaluation.home;
  const facts = FUEL_FACTS[heating.fuel];
  const saved = context.entry.step.saved;
  const load = input('Heating load saved ΔQ_heat', saved.heatingLoadBtu, 'Btu', {
    source: 'line above',
  });
  const distribution = input(
    'Distribution efficiency η_dist',
    heating.distributionEfficiency ?? 1,
    '',
    {
      source:
        heating.distributionEfficiency === undefined
          ? 'none given in the home file, so 1'
          : 'the home file (heating.distributionEfficiency)',
    },
  );
  const base = {
    key: 'heating-fuel-saved',
    label: 'Heating fuel saved in a year',
    result: figure(saved.heatingFuelUnits, facts.unit),
  };
  if (heating.equipment === 'heatPump') {
    return {
      ...base,
      formula: 'ΔkWh = ΔQ_heat ÷ (HSPF × η_dist) ÷ 1000 Wh/kWh',
      inputs: [
        load,
        input(EFFICIENCY_WORDS.heatPump, heating.efficiency, 'Btu/Wh', {
          source: 'the home file (heating.efficiency)',
        }),
        distribution,
      ],
    };
  }
  return {
    ...base,
    formula: 'ΔF = ΔQ_heat ÷ (η × η_dist × H)',
    inputs: [
      load,
      input(EFFICIENCY_WORDS[heating.equipment], heating.efficiency, '', {
        source: 'the home file (heating.efficiency)',
      }),
      distribution,
      input(
        `Heat content H of ${FUEL_NAMES[heating.fuel]}`,
        facts.btuPerUnit,
        `Btu/${facts.unit}`,
        {
          source: facts.source,
        },
      ),
    ],
  };
}

function fanKwhLine(context: TraceContext): TraceLine {
  const { before, after } = context.flows;
  const given = context.evaluation.home.ventilation?.fanWattsPerCfm;
  const saved = context.entry.step.saved.ventilationFanKwh;
  return {
    key: 'fan-kwh-saved',
    label: 'Ventilation fan electricity saved in a year',
    formula: 'ΔkWh_fan = (Q_fan,before − Q_fan,after) × P × 8760 h ÷ 1000 W/kW',
    inputs: [
      airflow('Fan flow before Q_fan,before', before.fanCfm, 'line: fan flow before'),
      airflow('Fan flow after Q_fan,after', after.fanCfm, 'line: fan flow after'),
      input('Fan power per flow P', before.fanWattsPerCfm, 'W/cfm', {
        source:
          given === undefined
            ? `none given in the home file, so ${DEFAULT_FAN_WATTS_PER_CFM} W/cfm (efficient fans move about 3 cfm/W, from memory)`
            : 'the home file (ventilation.fanWattsPerCfm)',
      }),
      input('Hours in a year', HOURS_PER_YEAR, 'h'),
    ],
    result: figure(saved, 'kWh'),
    ...(saved < 0
      ? { note: 'Negative: the tighter house needs more fan flow, which costs electricity.' }
      : {}),
  };
}

function siteEnergyLine(context: TraceContext): TraceLine {
  const { heating, cooling } = context.evaluation.home;
  const facts = FUEL_FACTS[heating.fuel];
  const saved = context.entry.step.saved;
  return {
    key: 'site-energy-saved',
    label: 'Energy bought at the house saved in a year (site energy)',
    formula: `ΔE_site = (ΔF × H + ${electricTerm(cooling !== undefined)} × 3412 Btu/kWh) ÷ 1,000,000 Btu/MMBtu`,
    inputs: [
      input('Heating fuel saved ΔF', saved.heatingFuelUnits, facts.unit, {
        source: 'line: heating fuel saved',
      }),
      input(
        `Heat content H of ${FUEL_NAMES[heating.fuel]}`,
        facts.btuPerUnit,
        `Btu/${facts.unit}`,
        {
          source: facts.source,
        },
      ),
      ...(cooling
        ? [
            input('Cooling electricity saved ΔkWh_cool', saved.coolingKwh, 'kWh', {
              source: 'line: cooling electricity saved',
            }),
          ]
        : []),
      input('Fan electricity saved ΔkWh_fan', saved.ventilationFanKwh, 'kWh', {
        source: 'line: fan electricity saved',
      }),
    ],
    result: figure(saved.siteMMBtu, 'MMBtu'),
  };
}

function co2Line(context: TraceContext): TraceLine {
  const { heating, cooling, emissions } = context.evaluation.home;
  const facts = FUEL_FACTS[heating.fuel];
  const saved = context.entry.step.saved;
  const grid = input('Grid CO₂ factor c_grid', emissions?.electricityKgCo2PerKwh ?? 0, 'kg/kWh', {
    source:
      emissions?.electricityKgCo2PerKwh === undefined
        ? 'none given in the home file, so 0'
        : 'the home file (emissions.electricityKgCo2PerKwh)',
  });
  const electric = [
    ...(cooling ? [input('Cooling electricity saved ΔkWh_cool', saved.coolingKwh, 'kWh')] : []),
    input('Fan electricity saved ΔkWh_fan', saved.ventilationFanKwh, 'kWh'),
  ];
  const base = {
    key: 'co2-saved',
    label: 'CO₂ avoided in a year',
    result: figure(saved.co2Kg, 'kg'),
  };
  if (facts.co2KgPerMMBtu === null) {
    return {
      ...base,
      formula: cooling
        ? 'ΔCO₂ = (ΔkWh_heat + ΔkWh_cool + ΔkWh_fan) × c_grid'
        : 'ΔCO₂ = (ΔkWh_heat + ΔkWh_fan) × c_grid',
      inputs: [
        input('Heating electricity saved ΔkWh_heat', saved.heatingFuelUnits, 'kWh'),
        ...electric,
        grid,
      ],
    };
  }
  return {
    ...base,
    formula: `ΔCO₂ = ΔF × H ÷ 1,000,000 Btu/MMBtu × c_fuel + ${electricTerm(cooling !== undefined)} × c_grid`,
    inputs: [
      input('Heating fuel saved ΔF', saved.heatingFuelUnits, facts.unit),
      input(`Heat content H of ${FUEL_NAMES[heating.fuel]}`, facts.btuPerUnit, `Btu/${facts.unit}`),
      input(`CO₂ of ${FUEL_NAMES[heating.fuel]} c_fuel`, facts.co2KgPerMMBtu, 'kg/MMBtu', {
        source: facts.source,
      }),
      ...electric,
      grid,
    ],
  };
}

/** The air and energy lines, in the order they build on each other. */
export function energyLines(context: TraceContext): TraceLine[] {
  return [
    fanLine(context, 'before'),
    fanLine(context, 'after'),
    airflowLine(context, 'heating', 'before'),
    airflowLine(context, 'heating', 'after'),
    pressureLine(context),
    sensibleLine(context, 'heating'),
    heatingFuelLine(context),
    ...coolingLines(context),
    fanKwhLine(context),
    siteEnergyLine(context),
    co2Line(context),
  ];
}
