/**
 * How the Bills panel words a billing analysis (ui/bills-figures.ts): temperatures in °F or
 * °C, the slope per °F·day or per K·day, shares as percentages, warnings naming where they
 * come from. The fits are the core's own on bills made from a known house
 * (test/_lib/billing-files.ts).
 *
 * Sources: NIST SP 811 (2008), t/°C = (t/°F − 32)/1.8, and a difference of 1 K is 1.8 °F, so
 * a use per °F·day is 1.8 times that use per K·day.
 */
import { describe, expect, it } from 'vitest';
import { fitDegreeDays, measuredSavings, normalYearFromSeries } from '../../core/billing.ts';
import {
  fitRows,
  percentText,
  savingsWords,
  slopeText,
  temperatureText,
  warningLines,
  type BillsAnalysis,
} from '../../ui/bills-figures.ts';
import { billingScenario } from '../_lib/billing-files.ts';

function analysisOf(afterCount: number, estimate: number | null): BillsAnalysis {
  const scenario = billingScenario(afterCount);
  const shared = {
    temperatures: scenario.temperatures,
    normalYear: normalYearFromSeries(scenario.temperatures),
  };
  const pre = fitDegreeDays({
    ...shared,
    bills: scenario.bills.filter((bill) => bill.periodEnd <= scenario.workDone),
  });
  const post = fitDegreeDays({
    ...shared,
    bills: scenario.bills.filter((bill) => bill.periodStart >= scenario.workDone),
  });
  return {
    fuel: 'naturalGas',
    kind: 'heating',
    workDone: scenario.workDone,
    temperatureSource: 'stored',
    normalYearSource: 'series',
    spanningBills: 0,
    pre,
    post,
    savings: measuredSavings({ pre, post, estimatedSavingsPerYear: estimate ?? 0 }),
    estimate: { perYear: estimate, words: 'none in this test' },
  };
}

describe('the Bills panel’s figures', () => {
  it('shows a base temperature in °F, or in °C in SI', () => {
    expect(temperatureText(62, 'IP')).toBe('62.0 °F');
    expect(temperatureText(62, 'SI')).toBe(`${((62 - 32) / 1.8).toFixed(1)} °C`); // 16.7 °C
    expect(temperatureText(-40, 'SI')).toBe('-40.0 °C');
  });

  it('shows the slope per °F·day, or per K·day (1.8 times as much) in SI', () => {
    expect(slopeText(0.21, 'therm', 'IP')).toBe('0.2100 therm per °F·day');
    expect(slopeText(0.21, 'therm', 'SI')).toBe('0.3780 therm per K·day');
  });

  it('words shares as percentages, and none as a dash', () => {
    expect(percentText(0.0312)).toBe('3.1 %');
    expect(percentText(1.5, 0)).toBe('150 %');
    expect(percentText(null)).toBe('—');
  });

  it('puts the known house’s figures in the rows, before and after', () => {
    const analysis = analysisOf(12, 200);
    const rows = fitRows(analysis.pre, analysis.post, 'IP');
    expect(rows.map((row) => row.key)).toEqual([
      'bills',
      'base',
      'base-load',
      'slope',
      'nac',
      'r2',
      'cv',
      'nmbe',
    ]);
    const base = rows.find((row) => row.key === 'base');
    expect([base?.before, base?.after]).toEqual(['62.0 °F', '58.0 °F']);
    const slope = rows.find((row) => row.key === 'slope');
    expect([slope?.before, slope?.after]).toEqual([
      '0.2100 therm per °F·day',
      '0.1600 therm per °F·day',
    ]);
    expect(rows.find((row) => row.key === 'bills')?.before).toBe('12 (360 days)');
  });

  it('says the savings beside the estimate, and the share of it', () => {
    const analysis = analysisOf(12, 200);
    const saved = analysis.pre.normalizedAnnualUse - analysis.post.normalizedAnnualUse;
    const words = savingsWords(analysis);
    expect(words.measured).toBe(
      `${saved.toFixed(1)} therm a year (${((saved / analysis.pre.normalizedAnnualUse) * 100).toFixed(1)} % of the use before)`,
    );
    expect(words.estimated).toBe('200.0 therm a year');
    expect(words.realization).toBe(`${Math.round((saved / 200) * 100)} %`);
    expect(savingsWords(analysisOf(12, null)).estimated).toBe('none: none in this test');
  });

  it('names where each warning comes from', () => {
    const lines = warningLines(analysisOf(6, null));
    expect(lines[0]).toMatch(/^Bills after the work: only 6 bills/);
    expect(lines.at(-1)).toBe('Savings: the estimate is 0, so there is no realization rate.');
  });
});
