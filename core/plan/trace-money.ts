/**
 * The money lines of a measure's trace: its cost, a year's savings, their present value over
 * the measure's life with the NIST Handbook 135 UPV* factor of each fuel, NPV, SIR, simple
 * payback and the cost of saved energy. Money is Decimal as the plan computes it and is
 * shown to the cent, as the report gives it.
 */
import { capitalRecoveryFactor, escalatedUniformPresentValueFactor } from '../economics/index.ts';
import { FUEL_FACTS } from '../fuels.ts';
import {
  cents,
  electricTerm,
  figure,
  FUEL_NAMES,
  fourPlaces,
  input,
  type TraceContext,
  type TraceInput,
  type TraceLine,
} from './trace-parts.ts';

const UPV_FORMULA = 'UPV* = (1 + e) ÷ (d − e) × (1 − ((1 + e) ÷ (1 + d))ⁿ), and n when e = d';
const UPV_SOURCE =
  'NIST Handbook 135, the UPV* factor (savings escalating at a constant real rate)';

function costLine(context: TraceContext): TraceLine {
  const { cost } = context.written;
  const { measure } = context.entry.step;
  return {
    key: 'cost',
    label: 'What the measure costs',
    formula: 'C = M + h × r + (M + h × r) × k, each part to the cent',
    inputs: [
      input('Materials M', cents(measure.cost.materialsUsd), 'USD', {
        source: 'the measure as entered',
      }),
      input('Labour hours h', cost.laborHours, 'h', { source: 'the measure as entered' }),
      input('Labour rate r', cost.laborRateUsdPerHour, 'USD/h', {
        source: 'the measure as entered',
      }),
      input('Markup k', cost.markupFraction ?? 0, '', {
        source: cost.markupFraction === undefined ? 'none given, so 0' : 'the measure as entered',
      }),
    ],
    result: figure(cents(measure.cost.totalUsd), 'USD'),
    ...(measure.cost.healthAndSafety
      ? { note: 'A health-and-safety measure: done whatever it saves, and kept out of the SIR.' }
      : {}),
  };
}

/** The inputs a year's savings are priced from. */
function savingsInputs(context: TraceContext): TraceInput[] {
  const { home } = context.evaluation;
  const { saved } = context.entry.step;
  const { prices } = context;
  const facts = FUEL_FACTS[home.heating.fuel];
  const inputs = [
    input('Heating fuel saved ΔF', saved.heatingFuelUnits, facts.unit, {
      source: 'line: heating fuel saved',
    }),
    input(
      `Price of ${FUEL_NAMES[home.heating.fuel]} p_fuel`,
      prices.heating.usdPerUnitFloat,
      `USD/${facts.unit}`,
      {
        source: `the home’s prices (prices.${home.heating.fuel})`,
      },
    ),
  ];
  if (prices.electricity === null) return inputs;
  return [
    ...inputs,
    ...(home.cooling
      ? [
          input('Cooling electricity saved ΔkWh_cool', saved.coolingKwh, 'kWh', {
            source: 'line: cooling electricity saved',
          }),
        ]
      : []),
    input('Fan electricity saved ΔkWh_fan', saved.ventilationFanKwh, 'kWh', {
      source: 'line: fan electricity saved',
    }),
    input('Price of electricity p_elec', prices.electricity.usdPerUnitFloat, 'USD/kWh', {
      source: 'the home’s prices (prices.electricity)',
    }),
  ];
}

function lifeSource(context: TraceContext): string {
  const { type } = context.entry.step.measure;
  const given = context.written.lifeYears;
  // An exported home file carries the library's default life written in.
  return given === undefined || given === type.defaultLifeYears
    ? `library (${type.sources.life.mark}): ${type.sources.life.citation}`
    : 'the measure as entered';
}

function factorLine(
  context: TraceContext,
  part: 'heating' | 'electricity',
): { line: TraceLine; factor: number } {
  const { home } = context.evaluation;
  const { prices } = context;
  const price = part === 'heating' ? prices.heating : prices.electricity;
  const fuel = part === 'heating' ? home.heating.fuel : 'electricity';
  const escalationRateReal = price?.escalationRateReal ?? 0;
  const lifeYears = context.entry.step.measure.lifeYears;
  const factor = escalatedUniformPresentValueFactor({
    discountRateReal: prices.discountRateReal,
    escalationRateReal,
    years: lifeYears,
  }).toNumber();
  const given = home.prices[fuel]?.escalationRateReal;
  return {
    factor,
    line: {
      key: part === 'heating' ? 'upv-heating' : 'upv-electricity',
      label: `Present worth of one dollar a year of ${FUEL_NAMES[fuel]} savings over the life (UPV*)`,
      formula: UPV_FORMULA,
      inputs: [
        input('Real discount rate d', prices.discountRateReal, 'per year', {
          source: 'the home’s economics (economics.discountRateReal)',
        }),
        input(
          `Real escalation of the ${FUEL_NAMES[fuel]} price e`,
          escalationRateReal,
          'per year',
          {
            source:
              given === undefined
                ? 'none given, so 0'
                : `the home’s prices (prices.${fuel}.escalationRateReal)`,
          },
        ),
        input('Life of the measure n', lifeYears, 'years', { source: lifeSource(context) }),
      ],
      result: figure(factor, 'years'),
      note: UPV_SOURCE,
    },
  };
}

function presentValueLines(context: TraceContext): TraceLine[] {
  const { entry, prices } = context;
  const worth = prices.annualWorth(entry.step.saved);
  const heating = factorLine(context, 'heating');
  const withElectricity = !worth.electricityUsd.isZero();
  const electricity = withElectricity ? factorLine(context, 'electricity') : null;
  const fuelName = FUEL_NAMES[context.evaluation.home.heating.fuel];
  const pv: TraceLine = {
    key: 'pv-savings',
    label: 'Present value of the savings over the life',
    formula: withElectricity
      ? 'PV = S_fuel × UPV*_fuel + S_elec × UPV*_elec, to the cent'
      : 'PV = S_fuel × UPV*_fuel, to the cent',
    inputs: [
      input(`A year’s ${fuelName} savings S_fuel`, worth.heatingUsd.toNumber(), 'USD/yr', {
        source: 'ΔF × p_fuel, not rounded',
      }),
      input('Its factor UPV*_fuel', heating.factor, 'years', { source: 'line above' }),
      ...(electricity
        ? [
            input(
              'A year’s electricity savings S_elec',
              worth.electricityUsd.toNumber(),
              'USD/yr',
              {
                source: `${electricTerm(context.evaluation.home.cooling !== undefined)} × p_elec, not rounded`,
              },
            ),
            input('Its factor UPV*_elec', electricity.factor, 'years', { source: 'line above' }),
          ]
        : []),
    ],
    result: figure(cents(entry.worth.pvSavingsUsd), 'USD'),
  };
  return [heating.line, ...(electricity ? [electricity.line] : []), pv];
}

function ratioLines(context: TraceContext): TraceLine[] {
  const { worth, step } = context.entry;
  const { cost } = step.measure;
  const costInput = input('Cost C', cents(cost.totalUsd), 'USD', { source: 'line: cost' });
  const pvInput = input('Present value of the savings PV', cents(worth.pvSavingsUsd), 'USD', {
    source: 'line: present value',
  });
  const annualInput = input('First year’s savings S', cents(worth.annualSavingsUsd), 'USD/yr', {
    source: 'line: savings in a year',
  });
  const sirNote = cost.healthAndSafety
    ? 'No SIR: a health-and-safety measure is done whatever it saves.'
    : 'No SIR: the measure costs nothing.';
  const { prices } = context;
  const lifeYears = step.measure.lifeYears;
  return [
    {
      key: 'npv',
      label: 'Net present value (NPV)',
      formula: 'NPV = PV − C',
      inputs: [pvInput, costInput],
      result: figure(cents(worth.npvUsd), 'USD'),
    },
    {
      key: 'sir',
      label: 'Savings-to-investment ratio (SIR)',
      formula: 'SIR = PV ÷ C',
      inputs: [pvInput, costInput],
      result: figure(fourPlaces(worth.sir), ''),
      ...(worth.sir === null ? { note: sirNote } : {}),
    },
    {
      key: 'simple-payback',
      label: 'Simple payback',
      formula: 'SPB = C ÷ S',
      inputs: [costInput, annualInput],
      result: figure(fourPlaces(worth.simplePaybackYears), 'years'),
      ...(worth.simplePaybackYears === null
        ? { note: 'Never pays back: it saves nothing in the first year.' }
        : {}),
    },
    {
      key: 'cce',
      label: 'Cost of saved energy',
      formula: 'CCE = C × CRF ÷ ΔE_site',
      inputs: [
        costInput,
        input(
          'Capital recovery factor CRF',
          capitalRecoveryFactor(prices.discountRateReal, lifeYears).toNumber(),
          'per year',
          {
            source: `CRF = d ÷ (1 − (1 + d)^−n) at d = ${prices.discountRateReal}, n = ${lifeYears} years (Meier, Wright & Rosenfeld 1983); 1/n when d = 0`,
          },
        ),
        input('Site energy saved in a year ΔE_site', step.saved.siteMMBtu, 'MMBtu', {
          source: 'line: site energy saved',
        }),
      ],
      result: figure(
        worth.cceUsdPerMMBtu === null ? null : cents(worth.cceUsdPerMMBtu),
        'USD/MMBtu',
      ),
      ...(worth.cceUsdPerMMBtu === null ? { note: 'None: the measure saves no site energy.' } : {}),
    },
  ];
}

/** The money lines, from the cost to the cost of saved energy. */
export function moneyLines(context: TraceContext): TraceLine[] {
  const { prices, entry } = context;
  const electricity = prices.electricity !== null;
  const electricKwh = electricTerm(context.evaluation.home.cooling !== undefined);
  const annual: TraceLine = {
    key: 'annual-savings',
    label: 'Savings in a year',
    formula: electricity
      ? `S = ΔF × p_fuel + ${electricKwh} × p_elec, to the cent`
      : 'S = ΔF × p_fuel, to the cent',
    inputs: savingsInputs(context),
    result: figure(cents(entry.worth.annualSavingsUsd), 'USD/yr'),
  };
  return [costLine(context), annual, ...presentValueLines(context), ...ratioLines(context)];
}
