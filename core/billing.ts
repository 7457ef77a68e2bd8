/**
 * Billing analysis: what a house's utility bills say about its use, before and after the
 * work.
 *
 * Bills and daily mean temperatures come in as lists or CSV files (bills/bills-csv). Each
 * bill's degree days are summed from the daily means (degree-days). The fit (prism) finds
 * the outdoor temperature at which the house starts to need heat, the use that does not
 * follow the weather, and the use per degree day, and from them the use of a typical year
 * (normalized annual use); it says how well the bills fit (R², ASHRAE Guideline 14 CV(RMSE)
 * and NMBE) and warns, in plain words, when the fit is too poor to trust. Savings (savings)
 * are the drop in normalized use from the bills before to the bills after, against the
 * plan's estimate.
 *
 * Pure: no files, no clock. Dates are whole UTC days; a bill's periodEnd is the day of the
 * closing meter read and is not billed. Use is in the fuel's own unit (therm, gallon, kWh…).
 */
export type {
  BillInput,
  CheckedBill,
  DailyTemperature,
  TemperatureSeries,
  UtilityBill,
} from './billing/bills.ts';
export {
  billProblems,
  checkBills,
  checkDailyTemperatures,
  DAILY_MEAN_MAX_F,
  DAILY_MEAN_MIN_F,
  fuelUnit,
  temperatureProblems,
} from './billing/bills.ts';
export type { BillsCsvResult, TemperaturesCsvResult } from './billing/bills-csv.ts';
export {
  celsiusTextToFahrenheit,
  parseBillsCsv,
  parseTemperaturesCsv,
} from './billing/bills-csv.ts';
export type { CsvProblem } from './billing/csv-reader.ts';
export { csvProblemText } from './billing/csv-reader.ts';
export { dayNumberOf, isoDateOf } from './billing/dates.ts';
export { normalYearFromSeries } from './billing/normals.ts';
export type { BillWeather, DegreeDayKind, NormalYear } from './billing/degree-days.ts';
export {
  billWeather,
  checkNormalYear,
  dayDegreeDaysF,
  DAYS_PER_NORMAL_YEAR,
  normalYearDegreeDaysF,
  sumDegreeDaysF,
} from './billing/degree-days.ts';
export type {
  BillingWarning,
  BillingWarningCode,
  Guideline14Statistics,
} from './billing/fit-quality.ts';
export {
  guideline14Statistics,
  MONTHLY_CV_RMSE_MAX,
  MONTHLY_NMBE_MAX,
  R_SQUARED_MIN,
  RECOMMENDED_MIN_BILLS,
} from './billing/fit-quality.ts';
export type { LineFit } from './billing/least-squares.ts';
export { weightedLineFit } from './billing/least-squares.ts';
export type {
  BillWeighting,
  DegreeDayFit,
  DegreeDayFitInput,
  FittedBill,
} from './billing/prism.ts';
export {
  BASE_GRID_STEP_F,
  BASE_TOLERANCE_F,
  DEFAULT_BASE_RANGE_F,
  fitDegreeDays,
  fitDegreeDaysAtBase,
} from './billing/prism.ts';
export type {
  BillsSavingsInput,
  MeasuredSavings,
  SavingsInput,
  SavingsWarning,
} from './billing/savings.ts';
export { measuredSavings, measuredSavingsFromBills } from './billing/savings.ts';
