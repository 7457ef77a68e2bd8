/**
 * The evaluation report: plain JSON numbers for other programs and the command line. Money
 * is reported to the cent, computed in Decimal before it is turned into a number.
 */
import type { SeasonalAirflowCfm } from './energy.ts';
import type { Evaluation } from './evaluate.ts';
import type { LeakageWarning } from './leakage.ts';
import type { Decimal } from './money.ts';
import { centsToNumber } from './money.ts';
import type { PlanEntry } from './plan.ts';
import type { Caution } from './safety.ts';
import type { InfiltrationMethod, LeakLocation, Range } from './schema.ts';

export const REPORT_FORMAT = 'sealwork-evaluation/1';

export interface LeakageReport {
  cfm50: number;
  ach50: number;
  elaIn2: number;
  eqlaIn2: number;
  exponentN: number;
  coefficientCfmPerPaN: number;
  normalizedLeakage: number;
  cfm50PerEnvelopeFt2: number;
  envelopeAreaFt2: number;
  envelopeAreaEstimated: boolean;
  pointCount: number;
  rSquared: number | null;
  standardErrorN: number | null;
  standardErrorLnC: number | null;
  warnings: LeakageWarning[];
}

export interface MeasureReport {
  id: string;
  type: string;
  name: string;
  location: LeakLocation;
  status: string;
  rank: number;
  included: boolean;
  healthAndSafety: boolean;
  estimateMethod: string;
  estimateCfm50: Range;
  /** The realization factor the estimate was scaled by (the home's calibration), or null. */
  calibrationFactor: number | null;
  cfm50Reduction: number;
  cfm50Before: number;
  cfm50After: number;
  annualSavings: {
    heatingFuelUnits: number;
    heatingFuelUnit: string;
    coolingKwh: number;
    usd: number;
    mmbtu: number;
    co2Kg: number;
  };
  annualSavingsUsdRange: Range;
  costUsd: number;
  cost: { materialsUsd: number; laborUsd: number; markupUsd: number };
  lifeYears: number;
  pvSavingsUsd: number;
  npvUsd: number;
  sir: number | null;
  sirBelowOne: boolean;
  airr: number | null;
  irr: number | null;
  simplePaybackYears: number | null;
  discountedPaybackYears: number | null;
  cceUsdPerMMBtu: number | null;
}

export interface EvaluationReport {
  format: typeof REPORT_FORMAT;
  name: string;
  leakage: LeakageReport;
  infiltration: {
    method: InfiltrationMethod;
    /** Heating-season mean natural infiltration at test-in, cfm. */
    cfmNatural: number;
    achNatural: number;
    heatingSeasonCfm: number;
    coolingSeasonCfm: number;
  };
  /**
   * What the year's loads are summed over: the climate's degree days at 65 °F, or the hours of
   * its weather year at the house's balance points.
   */
  climateSource: {
    kind: 'degreeDays' | 'hourly';
    /** The climate's name, or the weather year's. */
    name: string;
    hours: number | null;
    heatingBalancePointF: number;
    coolingBalancePointF: number;
    heatingDegreeDaysF: number;
    coolingDegreeDaysF: number;
    latentGrainHours: number;
  };
  ranking: string;
  measures: MeasureReport[];
  package: {
    measureIds: string[];
    cfm50Before: number;
    cfm50After: number;
    ach50After: number;
    reductionCfm50: number;
    annualSavings: {
      heatingFuelUnits: number;
      heatingFuelUnit: string;
      coolingKwh: number;
      ventilationFanKwh: number;
      mmbtu: number;
      co2Kg: number;
    };
    annualSavingsUsd: number;
    annualSavingsUsdRange: Range;
    costUsd: number;
    healthAndSafetyCostUsd: number;
    pvSavingsUsd: number;
    npvUsd: number;
    sir: number | null;
    simplePaybackYears: number | null;
    ventilation: {
      requiredCfm: number;
      infiltrationCfm: number;
      infiltrationCfmBefore: number;
      fanCfm: number;
      fanCfmBefore: number;
      existingFanCfm: number;
      infiltrationCreditTaken: boolean;
      fanAdded: boolean;
      addedFanCfm: number;
      fanCostUsd: number;
      fanAnnualCostUsd: number;
    };
    financing: {
      principalUsd: number;
      aprNominal: number;
      months: number;
      monthlyPaymentUsd: number;
      monthlySavingsUsd: number;
      netMonthlyUsd: number;
      totalPaidUsd: number;
      firstYearNetUsd: number;
      lifetimeSavingsUsd: number;
      lifetimeNetUsd: number;
    } | null;
  };
  cautions: Caution[];
  notes: string[];
}

function money(value: Decimal): number {
  return centsToNumber(value);
}

function moneyOrNull(value: Decimal | null): number | null {
  return value === null ? null : centsToNumber(value);
}

/** A ratio, a rate or a number of years to four decimals: plenty for a report. */
function ratio(value: Decimal | number | null): number | null {
  if (value === null) return null;
  return typeof value === 'number'
    ? Math.round(value * 1e4) / 1e4
    : value.toDecimalPlaces(4).toNumber();
}

function measureReport(entry: PlanEntry, heatingFuelUnit: string): MeasureReport {
  const { step, worth } = entry;
  const { measure, saved } = step;
  return {
    id: measure.id,
    type: measure.type.id,
    name: measure.type.name,
    location: measure.location,
    status: measure.status,
    rank: entry.rank,
    included: entry.included,
    healthAndSafety: measure.cost.healthAndSafety,
    estimateMethod: measure.estimateMethod,
    estimateCfm50: { ...measure.estimateCfm50 },
    calibrationFactor: measure.calibrationFactor ?? null,
    cfm50Reduction: step.appliedCfm50,
    cfm50Before: step.cfm50Before,
    cfm50After: step.cfm50After,
    annualSavings: {
      heatingFuelUnits: saved.heatingFuelUnits,
      heatingFuelUnit,
      coolingKwh: saved.coolingKwh,
      usd: money(worth.annualSavingsUsd),
      mmbtu: saved.siteMMBtu,
      co2Kg: saved.co2Kg,
    },
    annualSavingsUsdRange: {
      low: money(entry.annualSavingsUsdRange.low),
      likely: money(entry.annualSavingsUsdRange.likely),
      high: money(entry.annualSavingsUsdRange.high),
    },
    costUsd: money(measure.cost.totalUsd),
    cost: {
      materialsUsd: money(measure.cost.materialsUsd),
      laborUsd: money(measure.cost.laborUsd),
      markupUsd: money(measure.cost.markupUsd),
    },
    lifeYears: measure.lifeYears,
    pvSavingsUsd: money(worth.pvSavingsUsd),
    npvUsd: money(worth.npvUsd),
    sir: ratio(worth.sir),
    sirBelowOne: entry.sirBelowOne,
    airr: ratio(worth.airr),
    irr: ratio(worth.irr),
    simplePaybackYears: ratio(worth.simplePaybackYears),
    discountedPaybackYears: ratio(worth.discountedPaybackYears),
    cceUsdPerMMBtu: moneyOrNull(worth.cceUsdPerMMBtu),
  };
}

/** Builds the report from an evaluation and the test-in figures computed beside it. */
export function buildReport(options: {
  evaluation: Evaluation;
  leakage: LeakageReport;
  airflow: SeasonalAirflowCfm;
  heatingFuelUnit: string;
}): EvaluationReport {
  const { evaluation, leakage, airflow, heatingFuelUnit } = options;
  const { home, plan } = evaluation;
  const pkg = plan.package;
  const volumeFt3 = home.house.conditionedVolumeFt3;
  const fan = pkg.ventilation.addedFan;
  return {
    format: REPORT_FORMAT,
    name: home.name,
    leakage,
    infiltration: {
      method: home.infiltrationMethod,
      cfmNatural: airflow.heatingCfm,
      achNatural: (airflow.heatingCfm * 60) / volumeFt3,
      heatingSeasonCfm: airflow.heatingCfm,
      coolingSeasonCfm: airflow.coolingCfm,
    },
    climateSource: climateSourceOf(evaluation),
    ranking: plan.ranking,
    measures: plan.entries.map((entry) => measureReport(entry, heatingFuelUnit)),
    package: {
      measureIds: pkg.measureIds,
      cfm50Before: pkg.cfm50Before,
      cfm50After: pkg.cfm50After,
      ach50After: (pkg.cfm50After * 60) / volumeFt3,
      reductionCfm50: pkg.cfm50Before - pkg.cfm50After,
      annualSavings: {
        heatingFuelUnits: pkg.annualSavings.heatingFuelUnits,
        heatingFuelUnit,
        coolingKwh: pkg.annualSavings.coolingKwh,
        ventilationFanKwh: pkg.annualSavings.ventilationFanKwh,
        mmbtu: pkg.annualSavings.siteMMBtu,
        co2Kg: pkg.annualSavings.co2Kg,
      },
      annualSavingsUsd: money(pkg.annualSavingsUsd),
      annualSavingsUsdRange: {
        low: money(pkg.annualSavingsUsdRange.low),
        likely: money(pkg.annualSavingsUsdRange.likely),
        high: money(pkg.annualSavingsUsdRange.high),
      },
      costUsd: money(pkg.costUsd),
      healthAndSafetyCostUsd: money(pkg.healthAndSafetyCostUsd),
      pvSavingsUsd: money(pkg.pvSavingsUsd),
      npvUsd: money(pkg.npvUsd),
      sir: ratio(pkg.sir),
      simplePaybackYears: ratio(pkg.simplePaybackYears),
      ventilation: {
        requiredCfm: pkg.ventilation.requiredCfm,
        infiltrationCfm: pkg.ventilation.infiltrationCfm,
        infiltrationCfmBefore: pkg.ventilation.infiltrationCfmBefore,
        fanCfm: pkg.ventilation.fanCfm,
        fanCfmBefore: pkg.ventilation.fanCfmBefore,
        existingFanCfm: pkg.ventilation.existingFanCfm,
        infiltrationCreditTaken: pkg.ventilation.infiltrationCreditTaken,
        fanAdded: fan !== null,
        addedFanCfm: fan?.cfm ?? 0,
        fanCostUsd: fan ? money(fan.costUsd) : 0,
        fanAnnualCostUsd: fan ? money(fan.annualCostUsd) : 0,
      },
      financing: pkg.financing && {
        principalUsd: money(pkg.financing.principalUsd),
        aprNominal: pkg.financing.aprNominal,
        months: pkg.financing.months,
        monthlyPaymentUsd: money(pkg.financing.monthlyPaymentUsd),
        monthlySavingsUsd: money(pkg.financing.monthlySavingsUsd),
        netMonthlyUsd: money(pkg.financing.netMonthlyUsd),
        totalPaidUsd: money(pkg.financing.totalPaidUsd),
        firstYearNetUsd: money(pkg.financing.firstYearNetUsd),
        lifetimeSavingsUsd: money(pkg.financing.lifetimeSavingsUsd),
        lifetimeNetUsd: money(pkg.financing.lifetimeNetUsd),
      },
    },
    cautions: evaluation.cautions,
    notes: evaluation.notes,
  };
}

/** Degree days' base of a climate, °F. */
const DEGREE_DAY_BASE_F = 65;

function climateSourceOf(evaluation: Evaluation): EvaluationReport['climateSource'] {
  const { model } = evaluation;
  const basis = model.climateBasis;
  const { seasons } = model.energyContext;
  const totals = {
    heatingDegreeDaysF: seasons.heatingDegreeDaysF,
    coolingDegreeDaysF: seasons.coolingDegreeDaysF,
    latentGrainHours: seasons.latentGrainHours,
  };
  if (basis.kind === 'hourly') {
    return {
      kind: 'hourly',
      name: basis.weatherName,
      hours: basis.hours,
      heatingBalancePointF: basis.heatingBalancePointF,
      coolingBalancePointF: basis.coolingBalancePointF,
      ...totals,
    };
  }
  return {
    kind: 'degreeDays',
    name: basis.climateName,
    hours: null,
    heatingBalancePointF: DEGREE_DAY_BASE_F,
    coolingBalancePointF: DEGREE_DAY_BASE_F,
    ...totals,
  };
}
