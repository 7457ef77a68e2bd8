/**
 * Typed text and the words the screens show: the one reading of a number typed in a box,
 * and the store's messages turned into sentences.
 */

/** Text typed as a number: thousands separators allowed ("1,850"), nothing else. */
export function parseNumber(text: string): number | null {
  const cleaned = text.trim().replace(/,/g, '');
  if (cleaned === '' || !/^[-+]?(\d+\.?\d*|\.\d+)$/.test(cleaned)) return null;
  return Number(cleaned);
}

/** Words with a capital first letter ("expected a number" → "Expected a number"). */
export function capitalized(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Words as a sentence: trimmed, a capital first, a full stop last unless it has one. */
export function sentence(text: string): string {
  const capital = capitalized(text.trim());
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
