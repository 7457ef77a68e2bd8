/**
 * Economics of a retrofit: present-value factors, measures of worth and loan cash flows.
 * The `read*` input helpers of present-value.ts stay internal to this folder.
 */
export {
  singlePresentValueFactor,
  uniformPresentValueFactor,
  escalatedUniformPresentValueFactor,
  realDiscountRate,
  presentValueOfAnnualAmount,
  capitalRecoveryFactor,
} from './present-value.ts';
export type {
  EscalatedFactorOptions,
  RealDiscountRateOptions,
  AnnualAmountOptions,
} from './present-value.ts';
export {
  netPresentValue,
  savingsToInvestmentRatio,
  adjustedInternalRateOfReturn,
  simplePaybackYears,
  discountedPaybackYears,
  costOfSavedEnergy,
} from './measures-of-worth.ts';
export { internalRateOfReturn } from './internal-rate-of-return.ts';
export type {
  SavingsAndInvestment,
  AdjustedRateOptions,
  SimplePaybackOptions,
  DiscountedPaybackOptions,
  CostOfSavedEnergyOptions,
} from './measures-of-worth.ts';
export {
  loanMonthlyPaymentUsd,
  loanMonthlyPaymentRoundedUsd,
  loanSchedule,
  monthlyCashFlow,
} from './loan.ts';
export type {
  LoanTerms,
  LoanScheduleMonth,
  MonthlyCashFlowOptions,
  MonthlyCashFlowMonth,
} from './loan.ts';
