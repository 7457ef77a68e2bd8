/**
 * The air lines of a measure's trace: the continuous ventilation fan flow 62.2 asks for, the
 * outdoor air of each season before and after the step as the home model values them
 * (HomeModel.ventilatedAirflow), the site's air pressure, and the sensible heat the
 * difference in air carries over a season.
 */
import { pressureRatioAtElevation } from '../air.ts';
import { AIR_HEAT_CAPACITY_BTU_PER_FT3_F } from '../constants.ts';
import { seasonalSensibleLoadBtu } from '../energy.ts';
import type { ClimateBasis } from '../home-model.ts';
import type { InfiltrationMethod } from '../schema.ts';
import { airflow, figure, input, type TraceContext, type TraceLine } from './trace-parts.ts';

export type Season = 'heating' | 'cooling';
export type Moment = 'before' | 'after';

const METHOD_WORDS: Readonly<Record<InfiltrationMethod, string>> = {
  nFactor: 'LBL climate and height factor method: Q_nat = CFM50 ÷ N (ACHnat = ACH50 ÷ N)',
  lblBasic: 'LBL basic model over the season’s means: Q_nat = ELA·√(Cs·ΔT + Cw·U²)',
  aim2: 'enhanced (AIM-2) model over the season’s means, with the leaks by location',
  ashrae622: 'ASHRAE 62.2 effective annual infiltration: Q_nat = 0.052·CFM50·wsf·(H/8.2 ft)^0.4',
};

const SEA_LEVEL_HEAT_CAPACITY_SOURCE =
  '0.075 lb/ft³ × 0.24 Btu/(lb·°F), sea-level standard air (ASHRAE HoF, load calculation chapters)';
const MOMENT_WORDS: Readonly<Record<Moment, string>> = { before: 'before', after: 'after' };

/** The continuous fan flow at the leakage before or after the step. */
export function fanLine(context: TraceContext, moment: Moment): TraceLine {
  const { model, home } = context.evaluation;
  const flows = context.flows[moment];
  const { need } = flows;
  const credit = flows.balanced ? 1 : need.infiltrationCfm / need.requiredCfm;
  return {
    key: `fan-flow-${moment}`,
    label: `Continuous ventilation fan flow ${MOMENT_WORDS[moment]} this step`,
    formula: 'Q_fan = max(Q_existing, Q_tot − Φ·Q_inf)',
    inputs: [
      airflow(
        'Fans the house already runs Q_existing',
        model.existingFanCfm,
        home.ventilation?.existingFanCfm === undefined
          ? 'none given in the home file, so 0'
          : 'the home file (ventilation.existingFanCfm)',
      ),
      airflow(
        '62.2 total ventilation rate Q_tot',
        need.requiredCfm,
        'ASHRAE 62.2 §4.1: 0.03 cfm/ft² × floor area + 7.5 cfm × (bedrooms + 1)',
      ),
      airflow(
        '62.2 infiltration credit Q_inf',
        need.infiltrationCfm,
        need.infiltrationCreditTaken
          ? 'ASHRAE 62.2 §4.1.2: 0.052 × CFM50 × wsf × (H/8.2 ft)^0.4 at this leakage'
          : 'no wsf given for the climate, so no credit is taken',
      ),
      input('Credit factor Φ', credit, '', {
        source: flows.balanced
          ? '1 for a balanced fan (ASHRAE 62.2 §4.1.2)'
          : 'Q_inf ÷ Q_tot for an exhaust or supply fan (ASHRAE 62.2 §4.1.2)',
      }),
    ],
    result: figure(flows.fanCfm, 'cfm', 'flowCfm'),
  };
}

/** A season's outdoor air before or after the step: infiltration and fan flow combined. */
export function airflowLine(context: TraceContext, season: Season, moment: Moment): TraceLine {
  const flows = context.flows[moment];
  const key = season === 'heating' ? 'heatingCfm' : 'coolingCfm';
  const formula =
    flows.fanCfm === 0
      ? 'Q = Q_nat'
      : flows.balanced
        ? 'Q = Q_fan + Q_nat'
        : 'Q = √(Q_fan² + Q_nat²)';
  return {
    key: `${season}-airflow-${moment}`,
    label: `Mean outdoor air over the ${season} season ${MOMENT_WORDS[moment]} this step`,
    formula,
    inputs: [
      airflow(
        `Natural infiltration Q_nat, ${season} season`,
        flows.infiltration[key],
        METHOD_WORDS[context.evaluation.home.infiltrationMethod],
      ),
      airflow(
        'Ventilation fan flow Q_fan',
        flows.fanCfm,
        flows.balanced
          ? `line: fan flow ${moment}; a balanced fan adds its whole flow (ASHRAE HoF 2009 ch. 16)`
          : `line: fan flow ${moment}; an exhaust or supply fan adds in quadrature (ASHRAE HoF 2009 ch. 16)`,
      ),
    ],
    result: figure(flows.combined[key], 'cfm', 'flowCfm'),
  };
}

/** The site's air pressure as a share of sea level, from its elevation. */
export function pressureLine(context: TraceContext): TraceLine {
  const { climate } = context.evaluation.home;
  return {
    key: 'pressure-ratio',
    label: 'Air pressure at the site as a share of sea-level pressure',
    formula: 'p/p₀ = (1 − 6.8754×10⁻⁶ /ft × Z)^5.2559',
    inputs: [
      input('Site elevation Z', climate.elevationFt, 'ft', {
        quantity: 'lengthFt',
        source: `climate “${climate.name}”`,
      }),
    ],
    result: figure(pressureRatioAtElevation(climate.elevationFt), ''),
  };
}

/** The sensible load saved in one season, the inputs and the formula it is worked with. */
export function sensibleLine(context: TraceContext, season: Season): TraceLine {
  const { climate } = context.evaluation.home;
  const { seasons } = context.evaluation.model.energyContext;
  const basis = context.evaluation.model.climateBasis;
  const key = season === 'heating' ? 'heatingCfm' : 'coolingCfm';
  const degreeDays = season === 'heating' ? seasons.heatingDegreeDaysF : seasons.coolingDegreeDaysF;
  const before = context.flows.before.combined[key];
  const after = context.flows.after.combined[key];
  const loadOf = (airflowCfm: number) =>
    seasonalSensibleLoadBtu({
      airflowCfm,
      degreeDaysF: degreeDays,
      elevationFt: climate.elevationFt,
    });
  const symbol = season === 'heating' ? 'HDD' : 'CDD';
  return {
    key: season === 'heating' ? 'heating-load-saved' : 'cooling-sensible-saved',
    label:
      season === 'heating'
        ? 'Heating load saved in a year'
        : 'Cooling load saved in a year, sensible part',
    formula: `ΔQ = 0.018 Btu/(ft³·°F) × p/p₀ × (Q_before − Q_after) × 60 min/h × 24 h/day × ${symbol}`,
    inputs: [
      input('Heat capacity of sea-level air', AIR_HEAT_CAPACITY_BTU_PER_FT3_F, 'Btu/(ft³·°F)', {
        source: SEA_LEVEL_HEAT_CAPACITY_SOURCE,
      }),
      input('Site pressure ratio p/p₀', pressureRatioAtElevation(climate.elevationFt), '', {
        source: 'line: site pressure ratio (thinner air carries less heat)',
      }),
      airflow(`Outdoor air before Q_before`, before, `line: ${season}-season air before`),
      airflow(`Outdoor air after Q_after`, after, `line: ${season}-season air after`),
      degreeDaysInput(season, degreeDays, basis, climate.name),
    ],
    result: figure(
      season === 'heating'
        ? context.entry.step.saved.heatingLoadBtu
        : loadOf(before) - loadOf(after),
      'Btu',
    ),
  };
}

/** The degree days of a season's load, and where they come from. */
function degreeDaysInput(
  season: Season,
  degreeDaysF: number,
  basis: ClimateBasis,
  climateName: string,
) {
  const symbol = season === 'heating' ? 'HDD' : 'CDD';
  const kind = season === 'heating' ? 'Heating' : 'Cooling';
  if (basis.kind === 'degreeDays') {
    return input(`${kind} degree days ${symbol} (base 65 °F)`, degreeDaysF, '°F·day', {
      quantity: 'degreeDaysF',
      source: `climate “${climateName}”`,
    });
  }
  const baseF = season === 'heating' ? basis.heatingBalancePointF : basis.coolingBalancePointF;
  return input(
    `${kind} degree days ${symbol} from the hours (base: the balance point, ${baseF} °F)`,
    degreeDaysF,
    '°F·day',
    {
      quantity: 'degreeDaysF',
      source:
        `the ${basis.hours.toLocaleString('en-US')} hours of “${basis.weatherName}”; Q is each ` +
        `hour's infiltration weighted by that hour's degrees`,
    },
  );
}
