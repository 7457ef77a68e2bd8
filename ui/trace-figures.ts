/**
 * The figures of a measure's trace (core/plan/trace.ts) as the screens show them: flows,
 * lengths, areas and degree days in the project's unit system through ui/quantities.ts,
 * money in dollars, everything else in the unit its formula uses, each with its unit.
 */
import type { TraceFigure } from '../core/plan/trace.ts';
import { formatUsd } from '../core/format.ts';
import { formatQuantity, shownValue, type UnitSystem } from './quantities.ts';

const plainFormats = new Map<number, Intl.NumberFormat>();

/**
 * Decimals that keep about four significant figures of a value, none past the thousands:
 * 6,502,611 Btu, 567.1 cfm, 0.9591, 0.000123.
 */
export function decimalsFor(value: number): number {
  const size = Math.abs(value);
  if (size === 0 || size >= 1000) return 0;
  return Math.min(8, Math.max(0, 3 - Math.floor(Math.log10(size))));
}

/** A number with thousands separators and at most `decimals` decimals, no trailing zeros. */
function plainNumber(value: number, decimals: number): string {
  let format = plainFormats.get(decimals);
  if (!format) {
    format = new Intl.NumberFormat('en-US', { maximumFractionDigits: decimals });
    plainFormats.set(decimals, format);
  }
  const text = format.format(value);
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/** Dollars to the cent, or to four decimals where the figure is not yet rounded to the cent. */
function dollars(amountUsd: number): string {
  const wholeCents = Math.abs(amountUsd * 100 - Math.round(amountUsd * 100)) < 1e-6;
  if (wholeCents) return formatUsd(amountUsd, { cents: true });
  const text = `$${plainNumber(Math.abs(amountUsd), 4)}`;
  return amountUsd < 0 ? `-${text}` : text;
}

const PER_UNIT_WORDS: Readonly<Record<string, string>> = { h: 'hour', yr: 'year' };

/**
 * A figure of a trace with its unit, in the shown system.
 *
 * @param figure - the value as the engine holds it (US customary units, dollars)
 * @param units - the unit system the project shows
 * @returns e.g. "350 CFM50" or "165.2 L/s at 50 Pa", "$143.60 a year", "0.9591", "none"
 */
export function traceFigureText(figure: TraceFigure, units: UnitSystem): string {
  const { value, unit, quantity } = figure;
  if (value === null) return 'none';
  if (quantity !== undefined) {
    // Degree days are whole by custom; other quantities keep about four figures.
    const decimals =
      quantity === 'degreeDaysF' ? 0 : decimalsFor(shownValue(quantity, value, units));
    if (unit === 'CFM50') {
      return units === 'IP'
        ? `${plainNumber(value, decimals)} CFM50`
        : `${formatQuantity(quantity, value, units, decimals)} at 50 Pa`;
    }
    return formatQuantity(quantity, value, units, decimals);
  }
  if (unit === 'USD') return dollars(value);
  if (unit === 'USD/yr') return `${dollars(value)} a year`;
  if (unit.startsWith('USD/')) {
    const per = unit.slice('USD/'.length);
    return `${dollars(value)} per ${PER_UNIT_WORDS[per] ?? per}`;
  }
  const text = plainNumber(value, decimalsFor(value));
  return unit === '' ? text : `${text} ${unit}`;
}
