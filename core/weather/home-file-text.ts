/**
 * The text a home file is saved as. Kept apart from the schema (no zod here), so every host
 * can write files the same way: the page (ui/ may import pure core helpers) as well as the
 * desktop and the command line.
 */

/** The hourly lists' holders in a home file or in a bundle's file (`file.weatherYear.hours`). */
function hourListHolders(value: unknown): Set<object> {
  const holders = new Set<object>();
  const recordOf = (item: unknown): Record<string, unknown> | undefined =>
    typeof item === 'object' && item !== null && !Array.isArray(item)
      ? (item as Record<string, unknown>)
      : undefined;
  const top = recordOf(value);
  for (const file of [top, recordOf(top?.file)]) {
    const hours = recordOf(recordOf(file?.weatherYear)?.hours);
    if (hours) holders.add(hours);
  }
  return holders;
}

/**
 * A home file (or a bundle of one with its photos) as the text of a file: JSON indented by
 * two spaces, as the hosts write it, except that each of the weather year's hourly lists
 * stays on one line. A year of 8,760 hours then takes a few hundred kB (0.37 MB for the
 * tests' generated year, whose temperatures have every digit) rather than 70,080 indented
 * lines (1.0 MB); a file without a weather year is exactly `JSON.stringify(value, null, 2)`.
 *
 * @param value - the home file or bundle, as exported
 * @returns the text, ending with a newline
 */
export function homeFileText(value: unknown): string {
  const holders = hourListHolders(value);
  const plain = (): string => `${JSON.stringify(value, null, 2)}\n`;
  if (holders.size === 0) return plain();
  const lists: string[] = [];
  // A marker no exported text holds; should one ever be there, the plain layout is used.
  const marker = (index: number): string => JSON.stringify(`\u0000hours ${index}\u0000`);
  const text = JSON.stringify(
    value,
    function keepOnOneLine(this: unknown, _key: string, item: unknown): unknown {
      if (!Array.isArray(item) || !holders.has(this as object)) return item;
      lists.push(JSON.stringify(item));
      return `\u0000hours ${lists.length - 1}\u0000`;
    },
    2,
  );
  let written = text;
  for (const [index, list] of lists.entries()) {
    const parts = written.split(marker(index));
    if (parts.length !== 2) return plain();
    written = parts.join(list);
  }
  return `${written}\n`;
}
