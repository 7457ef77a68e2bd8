/**
 * Hour by hour beside degree days: a home planned on its weather year, and the same steps
 * (the same measures, in the same order, removing the same leakage) valued on its climate's
 * degree days and season means, so the difference is the weather's alone. With the reasons
 * in plain words: the degree days at the balance point against those at 65 °F, and the
 * infiltration of the colder, windier hours that carry more of the load.
 */
import { energySaved, type AnnualEnergy } from '../energy.ts';
import { InputError } from '../errors.ts';
import { prepareHome, type EvaluateOptions, type Evaluation } from '../evaluate.ts';
import { FUEL_FACTS } from '../fuels.ts';
import type { HomeModel } from '../home-model.ts';
import type { PriceBook } from '../plan/prices.ts';

/** One source's figures for a measure's step, or the package's. */
export interface SourceSavings {
  heatingFuelUnits: number;
  coolingKwh: number;
  /** Heating fuel and electricity (cooling and fans) at the home's prices, $ a year. */
  annualSavingsUsd: number;
}

export interface MeasureComparison {
  measureId: string;
  name: string;
  hourly: SourceSavings;
  degreeDays: SourceSavings;
  /** Hourly ÷ degree-day dollars; null when the degree-day step saves nothing. */
  ratio: number | null;
}

export interface DegreeDayComparison {
  heatingFuelUnit: string;
  hourly: {
    weatherName: string;
    hours: number;
    heatingBalancePointF: number;
    heatingDegreeDaysF: number;
    coolingDegreeDaysF: number;
    /** Heating-season natural infiltration at test-in, degree-hour weighted, cfm. */
    testInHeatingCfm: number;
  };
  degreeDays: {
    climateName: string;
    heatingDegreeDaysF: number;
    coolingDegreeDaysF: number;
    /** Heating-season natural infiltration at test-in from the season's means, cfm. */
    testInHeatingCfm: number;
  };
  measures: MeasureComparison[];
  package: { hourly: SourceSavings; degreeDays: SourceSavings };
  /** Why the two differ, in plain words, largest effect first. */
  reasons: string[];
}

function dollarsOf(saved: AnnualEnergy, prices: PriceBook): SourceSavings {
  const electricKwh = saved.coolingKwh + saved.ventilationFanKwh;
  return {
    heatingFuelUnits: saved.heatingFuelUnits,
    coolingKwh: saved.coolingKwh,
    annualSavingsUsd:
      saved.heatingFuelUnits * prices.heating.usdPerUnitFloat +
      (electricKwh === 0 ? 0 : electricKwh * (prices.electricity?.usdPerUnitFloat ?? 0)),
  };
}

function addSavings(a: SourceSavings, b: SourceSavings): SourceSavings {
  return {
    heatingFuelUnits: a.heatingFuelUnits + b.heatingFuelUnits,
    coolingKwh: a.coolingKwh + b.coolingKwh,
    annualSavingsUsd: a.annualSavingsUsd + b.annualSavingsUsd,
  };
}

/** Two figures within this share of each other are called the same in the reasons. */
const SAME_SHARE = 0.005;

const NO_SAVINGS: SourceSavings = { heatingFuelUnits: 0, coolingKwh: 0, annualSavingsUsd: 0 };

function percentDifference(hourly: number, degreeDays: number): string {
  if (degreeDays === 0) return 'where degree days give none';
  const percent = Math.round(((hourly - degreeDays) / degreeDays) * 100);
  if (percent === 0) return 'about the same as degree days give';
  return `${Math.abs(percent)} % ${percent > 0 ? 'more' : 'less'} than degree days give`;
}

/**
 * Compares an hourly evaluation with its steps valued on degree days.
 *
 * @param evaluation - the home evaluated hour by hour (its file has `hourlyWeather`)
 * @param options - the same options it was evaluated with (library, weather)
 * @throws InputError naming `hourlyWeather` for a home planned on degree days, or the climate
 *   field the degree-day method needs (e.g. `climate.heatingSeason`)
 */
export function compareWithDegreeDays(
  evaluation: Evaluation,
  options: EvaluateOptions = {},
): DegreeDayComparison {
  const { home, model, plan } = evaluation;
  const basis = model.climateBasis;
  if (basis.kind !== 'hourly') {
    throw InputError.at('hourlyWeather', 'expected a home planned hour by hour to compare');
  }
  const { hourlyWeather: _hourly, ...degreeDayHome } = home;
  const degreeDay = prepareHome(degreeDayHome, options);
  const prices = degreeDay.prices;
  const ddModel: HomeModel = degreeDay.model;

  let hourlyTotal = NO_SAVINGS;
  let ddTotal = NO_SAVINGS;
  const measures = plan.entries
    .filter((entry) => entry.included)
    .map(({ step }): MeasureComparison => {
      const hourly = dollarsOf(step.saved, prices);
      const degreeDays = dollarsOf(
        energySaved(ddModel.energyOf(step.leakageBefore), ddModel.energyOf(step.leakageAfter)),
        prices,
      );
      hourlyTotal = addSavings(hourlyTotal, hourly);
      ddTotal = addSavings(ddTotal, degreeDays);
      return {
        measureId: step.measure.id,
        name: step.measure.type.name,
        hourly,
        degreeDays,
        ratio:
          degreeDays.annualSavingsUsd === 0
            ? null
            : hourly.annualSavingsUsd / degreeDays.annualSavingsUsd,
      };
    });

  const hourlySeasons = model.energyContext.seasons;
  const ddSeasons = ddModel.energyContext.seasons;
  const hourlyCfm = model.airflow(model.testIn).heatingCfm;
  const ddCfm = ddModel.airflow(ddModel.testIn).heatingCfm;
  const reasons = [
    `Heating degree days: ${Math.round(hourlySeasons.heatingDegreeDaysF).toLocaleString('en-US')} ` +
      `from the hours below the balance point of ${basis.heatingBalancePointF} °F, against ` +
      `${Math.round(ddSeasons.heatingDegreeDaysF).toLocaleString('en-US')} from the climate's daily ` +
      `means at 65 °F (${percentDifference(hourlySeasons.heatingDegreeDaysF, ddSeasons.heatingDegreeDaysF)}).`,
    `Natural infiltration at test-in over the heating season: ${hourlyCfm.toFixed(1)} cfm with ` +
      `each hour's temperature difference and wind, counted by that hour's share of the load, ` +
      `against ${ddCfm.toFixed(1)} cfm from the season's mean difference and wind ` +
      `(${percentDifference(hourlyCfm, ddCfm)})` +
      (Math.abs(hourlyCfm - ddCfm) <= SAME_SHARE * ddCfm
        ? '.'
        : ': the colder and windier hours drive more flow and carry more of the load, so the ' +
          'hours weigh them as one season’s means cannot.'),
    `The package saves $${hourlyTotal.annualSavingsUsd.toFixed(2)} a year hour by hour and ` +
      `$${ddTotal.annualSavingsUsd.toFixed(2)} on degree days ` +
      `(${percentDifference(hourlyTotal.annualSavingsUsd, ddTotal.annualSavingsUsd)}); both value ` +
      `the same steps in the same order.`,
  ];
  if (home.cooling) {
    reasons.push(
      `Cooling degree days: ${Math.round(hourlySeasons.coolingDegreeDaysF).toLocaleString('en-US')} ` +
        `above ${basis.coolingBalancePointF} °F from the hours, ` +
        `${Math.round(ddSeasons.coolingDegreeDaysF).toLocaleString('en-US')} in the climate; the ` +
        `hours also give the moisture each humid hour brings in.`,
    );
  }
  if (home.infiltrationMethod === 'nFactor' || home.infiltrationMethod === 'ashrae622') {
    reasons.push(
      'This home’s infiltration method does not follow the weather, so only the degree days differ.',
    );
  }

  return {
    heatingFuelUnit: FUEL_FACTS[home.heating.fuel].unit,
    hourly: {
      weatherName: basis.weatherName,
      hours: basis.hours,
      heatingBalancePointF: basis.heatingBalancePointF,
      heatingDegreeDaysF: hourlySeasons.heatingDegreeDaysF,
      coolingDegreeDaysF: hourlySeasons.coolingDegreeDaysF,
      testInHeatingCfm: hourlyCfm,
    },
    degreeDays: {
      climateName: home.climate.name,
      heatingDegreeDaysF: ddSeasons.heatingDegreeDaysF,
      coolingDegreeDaysF: ddSeasons.coolingDegreeDaysF,
      testInHeatingCfm: ddCfm,
    },
    measures,
    package: { hourly: hourlyTotal, degreeDays: ddTotal },
    reasons,
  };
}
