/**
 * A portfolio CSV's text as records, each with the line it starts on, and its header as the
 * layout of known columns the rows are read by. Problems of the text or the header are said
 * at line 1 or at the record's line.
 */
import Papa from 'papaparse';
import {
  COLUMNS_BY_NAME,
  CSV_COLUMNS,
  REQUIRED_CHOICES,
  REQUIRED_COLUMNS,
  type CsvColumn,
} from './csv-columns.ts';

/** One problem of a CSV file; `column` is empty when it concerns the whole line. */
export interface CsvProblem {
  line: number;
  column: string;
  message: string;
}

// ── Reading the text ─────────────────────────────────────────────────────────────────────

export interface CsvRecord {
  line: number;
  cells: string[];
}

const QUOTE_WORDS: Record<string, string> = {
  MissingQuotes: 'a quoted field has no closing quote',
  InvalidQuotes: 'a quote inside a field must be doubled ("") and the field quoted',
};

/** Records with the line each starts on; a quoted field may span lines. */
export function readRecords(csvText: string): { records: CsvRecord[]; problems: CsvProblem[] } {
  const text = csvText.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  const records: CsvRecord[] = [];
  const problems: CsvProblem[] = [];
  let start = 0;
  let line = 1;
  let counted = 0;
  Papa.parse<string[]>(text, {
    delimiter: ',',
    newline: '\n',
    skipEmptyLines: false,
    step: (result) => {
      for (let at = text.indexOf('\n', counted); at !== -1 && at < start;) {
        line += 1;
        at = text.indexOf('\n', at + 1);
      }
      counted = start;
      const cells = result.data.map((cell) => cell.trim());
      if (cells.some((cell) => cell !== '')) records.push({ line, cells });
      for (const error of result.errors) {
        problems.push({ line, column: '', message: QUOTE_WORDS[error.code] ?? error.message });
      }
      start = result.meta.cursor;
    },
  });
  return { records, problems };
}

// ── The header ───────────────────────────────────────────────────────────────────────────

export interface Layout {
  /** The column of each field position, or undefined for one that is ignored. */
  columns: (CsvColumn | undefined)[];
  present: Set<string>;
  /** Columns the header lacks and has been blamed for, so rows are not blamed again. */
  blamed: Set<string>;
}

/**
 * The layout of the header: the column of each field. A problem at line 1 is added to
 * `problems` for each name Sealwork does not know, each name given twice, and each required
 * column or choice the header lacks.
 */
export function readHeader(
  header: CsvRecord,
  records: readonly CsvRecord[],
  problems: CsvProblem[],
): Layout {
  const layout: Layout = { columns: [], present: new Set(), blamed: new Set() };
  const at = (column: string, message: string) => problems.push({ line: 1, column, message });
  header.cells.forEach((name, index) => {
    const spec = COLUMNS_BY_NAME.get(name);
    layout.columns.push(spec);
    if (name === '') {
      if (records.some((record) => (record.cells[index] ?? '') !== '')) {
        at('', `field ${index + 1} of the header has no column name but rows give it values`);
      }
    } else if (!spec) {
      const near = CSV_COLUMNS.find((known) => known.name.toLowerCase() === name.toLowerCase());
      const hint = near
        ? `did you mean "${near.name}"?`
        : name.includes(';')
          ? 'the fields seem to be separated by ";"; Sealwork reads comma-separated files'
          : 'check the spelling';
      at(name, `is not a column Sealwork knows (${hint})`);
    } else if (layout.present.has(name)) {
      at(name, 'appears twice in the header');
    }
    if (spec) layout.present.add(name);
  });
  for (const name of REQUIRED_COLUMNS) {
    if (layout.present.has(name)) continue;
    at(name, 'is required: the header has no such column');
    layout.blamed.add(name);
  }
  for (const { choices, words } of REQUIRED_CHOICES) {
    if (choices.some((names) => names.every((name) => layout.present.has(name)))) continue;
    const first = choices[0]?.[0] ?? '';
    at(first, `is required: the header needs ${words}`);
    for (const name of choices.flat()) layout.blamed.add(name);
  }
  return layout;
}
