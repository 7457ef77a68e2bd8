/**
 * How the figures of a measure's trace read on the screen (ui/trace-figures.ts): each with
 * its unit, flows in L/s and lengths in m in SI, money in dollars.
 *
 * Sources: the conversion factors follow from the exact foot of NIST SP 811 (2008),
 * appendix B: 1 ft = 0.3048 m, so 1 ft³/min = 0.3048³ × 1000 / 60 L/s ≈ 0.4719474 L/s, and a
 * temperature difference of 1 °F is 5/9 K.
 */
import { describe, expect, it } from 'vitest';
import { decimalsFor, traceFigureText } from '../../ui/trace-figures.ts';

const LITERS_PER_SECOND_PER_CFM = (0.3048 ** 3 * 1000) / 60;

describe('figures of a trace', () => {
  it('keeps about four significant figures, none past the thousands', () => {
    expect(decimalsFor(6_502_611)).toBe(0);
    expect(decimalsFor(567.14)).toBe(1);
    expect(decimalsFor(12.5)).toBe(2);
    expect(decimalsFor(0.9591)).toBe(4);
    expect(decimalsFor(0.000123)).toBe(7);
    expect(decimalsFor(0)).toBe(0);
  });

  it('shows leakage as CFM50 in IP and as L/s at 50 Pa in SI', () => {
    const leak = { value: 350, unit: 'CFM50', quantity: 'flowCfm' as const };
    expect(traceFigureText(leak, 'IP')).toBe('350 CFM50');
    const litersPerSecond = 350 * LITERS_PER_SECOND_PER_CFM; // 165.18 L/s
    expect(traceFigureText(leak, 'SI')).toBe(`${litersPerSecond.toFixed(1)} L/s at 50 Pa`);
  });

  it('shows air flows, lengths and degree days in the chosen system', () => {
    const flow = { value: 155.2417, unit: 'cfm', quantity: 'flowCfm' as const };
    expect(traceFigureText(flow, 'IP')).toBe('155.2 cfm');
    expect(traceFigureText(flow, 'SI')).toBe(
      `${(155.2417 * LITERS_PER_SECOND_PER_CFM).toFixed(2)} L/s`,
    );
    expect(traceFigureText({ value: 1150, unit: 'ft', quantity: 'lengthFt' }, 'SI')).toBe(
      // SI lengths carry one decimal more than their IP figure (ui/quantities.ts formatQuantity).
      `${(1150 * 0.3048).toFixed(2)} m`,
    );
    const hdd = { value: 6400, unit: '°F·day', quantity: 'degreeDaysF' as const };
    expect(traceFigureText(hdd, 'IP')).toBe('6,400 °F·day');
    expect(traceFigureText(hdd, 'SI')).toBe(
      `${Math.round((6400 * 5) / 9).toLocaleString('en-US')} K·day`,
    );
  });

  it('shows money to the cent, and unrounded parts to four decimals', () => {
    expect(traceFigureText({ value: 143.6, unit: 'USD/yr' }, 'IP')).toBe('$143.60 a year');
    expect(traceFigureText({ value: -12.5, unit: 'USD' }, 'SI')).toBe('-$12.50');
    expect(traceFigureText({ value: 44.852_71, unit: 'USD/yr' }, 'IP')).toBe('$44.8527 a year');
    expect(traceFigureText({ value: 1.2, unit: 'USD/therm' }, 'IP')).toBe('$1.20 per therm');
    expect(traceFigureText({ value: 50, unit: 'USD/h' }, 'IP')).toBe('$50.00 per hour');
  });

  it('shows other figures in the unit of their formula, pure numbers bare, none as a word', () => {
    expect(traceFigureText({ value: 6_502_610.99, unit: 'Btu' }, 'SI')).toBe('6,502,611 Btu');
    expect(traceFigureText({ value: 0.8, unit: '' }, 'IP')).toBe('0.8');
    expect(traceFigureText({ value: 0.03, unit: 'per year' }, 'IP')).toBe('0.03 per year');
    expect(traceFigureText({ value: 14.877_5, unit: 'years' }, 'IP')).toBe('14.88 years');
    expect(traceFigureText({ value: null, unit: '' }, 'IP')).toBe('none');
  });
});
