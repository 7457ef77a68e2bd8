/**
 * The Proposal's plain words: what the blower-door test found, what each figure of the
 * package means, and the assumptions behind them, each number formatted by core/format.ts so
 * the proposal shows the same figures as the Plan section and the command line.
 */
import { formatNumber, formatRatio, formatUsd, formatYears } from '../core/format.ts';
import { FUEL_FACTS } from '../core/fuels.ts';
import type { EvaluationReport } from '../core/report.ts';
import type { HomeFile } from '../core/schema.ts';
import { fuelWords } from './labels.ts';
import { formatQuantity, type UnitSystem } from './quantities.ts';

type PackageReport = EvaluationReport['package'];

/** A figure with what it means, in one line. */
export interface ExplainedFigure {
  key: string;
  label: string;
  value: string;
  meaning: string;
}

/** A flow in the shown units: "5,600 cfm" or "2,643 L/s". */
function flowWords(cfm: number, units: UnitSystem): string {
  return formatQuantity('flowCfm', cfm, units);
}

/** The leakage found at the test, and after the recommended work, in sentences. */
export function findingsWords(report: EvaluationReport, units: UnitSystem): string[] {
  const { leakage, infiltration, package: pkg } = report;
  // 50 Pa is the dynamic pressure ½·ρ·v² of a wind of v = √(2 · 50 / 1.2) ≈ 9.1 m/s ≈ 20 mph
  // (air at 1.2 kg/m³), hence the comparison.
  const sentences = [
    `With a fan in a doorway holding the house at 50 pascals below the outdoors (about the push ` +
      `of a 20 mph wind on every side), air leaked in at ${flowWords(leakage.cfm50, units)}: ` +
      `${formatNumber(leakage.cfm50)} CFM50, the cubic feet of air a minute at 50 pascals.`,
    `That is ${formatNumber(leakage.ach50, 1)} ACH50: at that pressure the whole of the air ` +
      `inside was replaced by outdoor air ${formatNumber(leakage.ach50, 1)} times an hour.`,
    `On an ordinary day of the heating season, with no fan running, about ` +
      `${flowWords(infiltration.heatingSeasonCfm, units)} of outdoor air seeps in on its own ` +
      `(${formatNumber(infiltration.achNatural, 2)} air changes an hour), and all of it has to be heated.`,
  ];
  if (pkg.measureIds.length > 0 && pkg.cfm50Before > 0) {
    const cutPercent = ((pkg.cfm50Before - pkg.cfm50After) / pkg.cfm50Before) * 100;
    sentences.push(
      `The recommended work should bring it to about ${formatNumber(pkg.cfm50After)} CFM50 ` +
        `(${formatNumber(pkg.ach50After, 1)} ACH50), ${formatNumber(cutPercent, 0)} % less leakage.`,
    );
  }
  return sentences;
}

/** The fuel and electricity the package saves in its first year, in words. */
export function fuelSavedWords(pkg: PackageReport, heatingFuel: string): string {
  const saved = pkg.annualSavings;
  const parts = [
    `${formatNumber(saved.heatingFuelUnits, 1)} ${saved.heatingFuelUnit} of ${fuelWords(heatingFuel).toLowerCase()}`,
  ];
  if (saved.coolingKwh > 0.5) parts.push(`${formatNumber(saved.coolingKwh, 0)} kWh of cooling`);
  return parts.join(' and ');
}

/** The package's figures, each with its meaning in one line. */
export function packageFigures(pkg: PackageReport, heatingFuel: string): ExplainedFigure[] {
  const range = pkg.annualSavingsUsdRange;
  return [
    {
      key: 'cost',
      label: 'Cost of the work',
      value: formatUsd(pkg.costUsd, { cents: true }),
      meaning: 'Materials, labour and markup, health-and-safety work included.',
    },
    {
      key: 'savings',
      label: 'Savings in the first year',
      value: formatUsd(pkg.annualSavingsUsd),
      meaning: `Likely figure; between ${formatUsd(range.low)} and ${formatUsd(range.high)} depending on how much each repair seals.`,
    },
    {
      key: 'fuel',
      label: 'Energy saved in the first year',
      value: fuelSavedWords(pkg, heatingFuel),
      meaning: 'Fuel the heating (and cooling) no longer burns to warm or cool leaking air.',
    },
    {
      key: 'payback',
      label: 'Simple payback',
      value: formatYears(pkg.simplePaybackYears),
      meaning: 'Years of first-year savings it takes to repay the cost.',
    },
    {
      key: 'npv',
      label: 'Lifetime net value (NPV)',
      value: formatUsd(pkg.npvUsd, { cents: true }),
      meaning:
        'Net present value: all the savings over the life of the work, in today’s dollars, less the cost. Above zero, the work pays for itself with money to spare.',
    },
    {
      key: 'sir',
      label: 'Savings per dollar (SIR)',
      value: formatRatio(pkg.sir),
      meaning:
        pkg.sir === null
          ? 'Savings-to-investment ratio: there is no energy work to divide its savings by.'
          : `Savings-to-investment ratio: each dollar spent on the energy work returns ${formatUsd(pkg.sir, { cents: true })} over its life, in today’s dollars (health-and-safety work left out).`,
    },
    {
      key: 'co2',
      label: 'Carbon dioxide avoided',
      value: `${formatNumber(pkg.annualSavings.co2Kg, 0)} kg a year`,
      meaning: 'CO2 no longer given off by burning the fuel and making the electricity saved.',
    },
  ];
}

const METHOD_WORDS: Readonly<Record<string, string>> = {
  nFactor: 'the LBL climate factor method (ACH50 divided by a factor for the climate and height)',
  lblBasic: 'the LBL basic model (stack and wind driving air through the leaks)',
  aim2: 'the enhanced (AIM-2) model, which accounts for where the leaks are',
  ashrae622: 'the ASHRAE 62.2 effective annual infiltration',
};

/** The way natural air leakage is worked out from the test, in words; an unknown code as stored. */
export function methodWords(code: string): string {
  return METHOD_WORDS[code] ?? code;
}

function percent(fraction: number, decimals = 1): string {
  return `${formatNumber(fraction * 100, decimals)} %`;
}

/** The money side of the assumptions: discount rate, period, financing. */
export function economicsFacts(
  file: HomeFile,
  report: EvaluationReport,
): { term: string; value: string }[] {
  const lives = report.measures.filter((m) => m.included).map((m) => m.lifeYears);
  const shortest = Math.min(...lives);
  const longest = Math.max(...lives);
  const facts = [
    {
      term: 'Discount rate',
      value: `${percent(file.economics.discountRateReal)} a year after inflation (real): a dollar saved in a later year counts for less than one today`,
    },
    {
      term: 'Period counted',
      value:
        lives.length === 0
          ? 'No work in the package'
          : shortest === longest
            ? `Each repair’s expected life: ${formatNumber(shortest)} years`
            : `Each repair’s expected life: ${formatNumber(shortest)} to ${formatNumber(longest)} years`,
    },
    {
      term: 'Fuel prices after this year',
      value:
        'Change each year by the rate shown beside each price (after inflation); none shown means prices stay level in today’s dollars',
    },
  ];
  const financing = report.package.financing;
  if (financing !== null) {
    facts.push({
      term: 'If the work is financed',
      value: `${formatUsd(financing.monthlyPaymentUsd, { cents: true })} a month for ${formatNumber(financing.months)} months at ${percent(financing.aprNominal)} APR, against first-year savings of ${formatUsd(financing.monthlySavingsUsd, { cents: true })} a month`,
    });
  }
  return facts;
}

/** The weather the figures rest on, in a family's words. */
export function weatherWords(file: HomeFile, source: EvaluationReport['climateSource']): string {
  if (source.kind === 'hourly') {
    return (
      `Worked hour by hour through ${formatNumber(source.hours ?? 0)} hours of weather for “${source.name}”, ` +
      'each hour’s temperature and wind, a typical year rather than any one winter'
    );
  }
  return `From the heating and cooling degree days of “${file.climate.name}”, a typical year rather than any one winter`;
}

/** Where the weather and the leakage figures come from. */
export function methodFacts(
  file: HomeFile,
  report: EvaluationReport,
): { term: string; value: string }[] {
  return [
    { term: 'Weather', value: weatherWords(file, report.climateSource) },
    {
      term: 'Natural air leakage',
      value: `Worked out from the test by ${methodWords(report.infiltration.method)}`,
    },
    {
      term: 'Fresh air',
      value:
        'ASHRAE Standard 62.2, the ventilation standard for homes, sets how much the tighter house needs',
    },
  ];
}

/** How the CO2 figure is counted. */
export function emissionsFacts(file: HomeFile): { term: string; value: string }[] {
  const fuel = FUEL_FACTS[file.heating.fuel];
  const facts = [];
  if (fuel.co2KgPerMMBtu !== null) {
    facts.push({
      term: `CO2 of ${fuelWords(file.heating.fuel).toLowerCase()}`,
      value: `${formatNumber(fuel.co2KgPerMMBtu, 2)} kg per million Btu burned (${fuel.source})`,
    });
  }
  const grid = file.emissions?.electricityKgCo2PerKwh;
  facts.push({
    term: 'CO2 of electricity',
    value:
      grid === undefined
        ? 'No grid figure given: electricity saved is counted at 0 kg CO2 per kWh'
        : `${formatNumber(grid, 3)} kg per kWh`,
  });
  return facts;
}

const SEVERITY_MEANINGS: Readonly<Record<string, string>> = {
  danger: 'a risk to life or of fire if ignored: it is dealt with before the crew starts',
  warning: 'handled as part of the job: a test, a rule to follow or a choice of material',
  notice: 'good practice, or something worth knowing',
};

/** What a caution's severity means for the family; an unknown code as stored. */
export function severityMeaning(code: string): string {
  return SEVERITY_MEANINGS[code] ?? code;
}
