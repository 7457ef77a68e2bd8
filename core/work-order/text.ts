/**
 * A work order as plain text for the command line and for printing: the target first, then
 * the measures, the bill of materials, the cautions about the house and the notes, each table
 * in aligned columns. Long messages wrap at {@link TEXT_WIDTH} characters.
 */
import { formatNumber } from '../format.ts';
import { materialOf } from '../measure-library/materials.ts';
import type { Caution } from '../safety.ts';
import type { WorkOrder } from '../work-order.ts';

/** Characters per line the wrapped paragraphs keep to. */
export const TEXT_WIDTH = 96;

/** A quantity with at most two decimals and no trailing zeros: 12, 1.5, 0.75. */
function quantityText(value: number): string {
  if (Number.isInteger(value)) return formatNumber(value);
  return formatNumber(value, 2).replace(/0+$/, '').replace(/\.$/, '');
}

/**
 * Rows as aligned columns, two spaces apart.
 *
 * @param rows - the header row first, then the cells, all as text
 * @param rightAligned - column indexes to align right (numbers)
 * @returns one line per row, trailing spaces trimmed
 */
export function alignedColumns(
  rows: readonly (readonly string[])[],
  rightAligned: readonly number[] = [],
): string[] {
  const widths: number[] = [];
  for (const row of rows) {
    row.forEach((cell, index) => {
      widths[index] = Math.max(widths[index] ?? 0, [...cell].length);
    });
  }
  return rows.map((row) =>
    row
      .map((cell, index) => {
        const pad = (widths[index] ?? 0) - [...cell].length;
        return rightAligned.includes(index) ? ' '.repeat(pad) + cell : cell + ' '.repeat(pad);
      })
      .join('  ')
      .trimEnd(),
  );
}

/**
 * A paragraph wrapped at word boundaries.
 *
 * @param text - the paragraph
 * @param indent - spaces before every line
 * @param firstPrefix - text put before the first line, inside the indent (e.g. "– ")
 * @returns the lines
 */
export function wrapped(text: string, indent: number, firstPrefix = ''): string[] {
  const lead = ' '.repeat(indent);
  const hang = ' '.repeat(indent + [...firstPrefix].length);
  const lines: string[] = [];
  let line = lead + firstPrefix;
  let empty = true;
  for (const word of text.split(/\s+/).filter((part) => part !== '')) {
    if (!empty && [...line].length + 1 + [...word].length > TEXT_WIDTH) {
      lines.push(line);
      line = hang + word;
    } else {
      line += (empty ? '' : ' ') + word;
    }
    empty = false;
  }
  lines.push(line);
  return lines;
}

function cautionLines(cautions: readonly Caution[], indent: number): string[] {
  return cautions.flatMap((caution) => [
    `${' '.repeat(indent)}[${caution.severity}] ${caution.code}`,
    ...wrapped(caution.message, indent + 2),
  ]);
}

function measureSection(order: WorkOrder): string[] {
  const header = ['#', 'Measure', 'Where', 'Quantity', 'Hours', 'CFM50 cut'];
  const rows = order.measures.map((measure, index) => [
    String(index + 1),
    measure.status === 'done' ? `${measure.name} (done)` : measure.name,
    measure.locationWords,
    measure.quantity === null
      ? 'count on site'
      : `${quantityText(measure.quantity)} ${measure.unitWords}`,
    formatNumber(measure.laborHours, 2),
    formatNumber(measure.expectedReductionCfm50),
  ]);
  const table = alignedColumns([header, ...rows], [0, 4, 5]);
  const lines = ['Measures', ...table.map((line) => `  ${line}`)];
  order.measures.forEach((measure, index) => {
    lines.push('', `  ${index + 1}. ${measure.name} [${measure.id}]`);
    lines.push(...wrapped(measure.description, 5));
    if (measure.note !== null) lines.push(...wrapped(measure.note, 5, 'Note: '));
    if (measure.materials.length > 0) {
      lines.push('     Materials:');
      const materialRows = measure.materials.map((need) => [
        need.name,
        `${quantityText(need.quantity)} ${need.useUnitWords}`,
      ]);
      lines.push(...alignedColumns(materialRows).map((line) => `       ${line}`));
    }
    if (measure.cautions.length > 0) {
      lines.push('     Cautions:');
      lines.push(...cautionLines(measure.cautions, 7));
    }
  });
  return lines;
}

function billSection(order: WorkOrder): string[] {
  if (order.billOfMaterials.length === 0) return ['Bill of materials', '  (none listed)'];
  const header = ['Material', 'Needed', 'Buy', 'Yield'];
  const rows = order.billOfMaterials.map((line) => [
    line.name,
    `${quantityText(line.useQuantity)} ${line.useUnitWords}`,
    `${formatNumber(line.purchaseCount)} ${line.purchaseUnitWords}`,
    line.yieldPerPurchaseUnit === 1
      ? ''
      : `${quantityText(line.yieldPerPurchaseUnit)} ${line.useUnitWords.split(' ')[0] ?? ''} per ${materialOf(line.materialId).purchaseUnit.one}`,
  ]);
  return ['Bill of materials', ...alignedColumns([header, ...rows]).map((line) => `  ${line}`)];
}

/**
 * The work order as plain text.
 *
 * @param order - the work order (core/work-order.ts `buildWorkOrder`)
 * @returns the text, lines joined with "\n", ending with a newline
 */
export function renderWorkOrderText(order: WorkOrder): string {
  const lines: string[] = [`Work order: ${order.homeName}`];
  if (order.demo) lines.push('Demo home: invented data, not a client’s house.');
  lines.push('', 'Test-out target');
  for (const sentence of order.target.sentences) lines.push(...wrapped(sentence, 2));
  lines.push(...wrapped(order.target.caution, 2));
  if (order.ventilationFan !== null) {
    lines.push(
      '',
      `Ventilation fan: add ${formatNumber(order.ventilationFan.cfm)} cfm (${order.ventilationFan.fanType}), as part of this job.`,
    );
  }
  lines.push('', ...measureSection(order));
  lines.push(
    '',
    `Labour: ${formatNumber(order.laborHoursTotal, 2)} hours for the work still to do.`,
  );
  lines.push('', ...billSection(order));
  lines.push('', 'About the house');
  lines.push(
    ...(order.houseCautions.length === 0
      ? ['  (no cautions)']
      : cautionLines(order.houseCautions, 2)),
  );
  if (order.notes.length > 0) {
    lines.push('', 'Notes');
    for (const note of order.notes) lines.push(...wrapped(note, 2, '- '));
  }
  return `${lines.join('\n')}\n`;
}
