/**
 * Numbers formatted for people: thousands separators, sensible precision, dollars. The
 * command line and the screens use these, so both show the same figures.
 */

const usdFormat = new Intl.NumberFormat('en-US', {
  style: 'currency',
  currency: 'USD',
  minimumFractionDigits: 0,
  maximumFractionDigits: 0,
});

const centsFormat = new Intl.NumberFormat('en-US', {
  style: 'currency',
  currency: 'USD',
  minimumFractionDigits: 2,
  maximumFractionDigits: 2,
});

const numberFormats = new Map<number, Intl.NumberFormat>();

/** A number with thousands separators and a fixed number of decimals. */
export function formatNumber(value: number, decimals = 0): string {
  let format = numberFormats.get(decimals);
  if (!format) {
    format = new Intl.NumberFormat('en-US', {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
    });
    numberFormats.set(decimals, format);
  }
  // Avoid "-0" for values that round to zero.
  const text = format.format(value);
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/** Dollars, whole by default (`$1,234`), or to the cent (`$1,234.56`). */
export function formatUsd(amountUsd: number, options: { cents?: boolean } = {}): string {
  const text = (options.cents ? centsFormat : usdFormat).format(amountUsd);
  return text === '-$0' || text === '-$0.00' ? text.slice(1) : text;
}

/** A ratio such as SIR to two decimals, or a dash when there is none. */
export function formatRatio(value: number | null): string {
  return value === null ? '—' : formatNumber(value, 2);
}

/** Years to one decimal; "never" when the savings never repay the cost, "> 100 yr" past a century. */
export function formatYears(value: number | null): string {
  if (value === null) return 'never';
  return value > 100 ? '> 100 yr' : `${formatNumber(value, 1)} yr`;
}
