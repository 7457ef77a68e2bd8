/**
 * A small CSV reader for the billing files, pure so the core can read them itself: the text
 * as records (RFC 4180: comma-separated; a field with commas, quotes or line breaks quoted;
 * a quote inside a quoted field doubled), each with the file line it starts on, and a header
 * row matched against the columns a file may have. Problems are said at a line (the header
 * is line 1) and a column, in the words the portfolio import uses.
 */

/** One problem of a CSV file; `column` is empty when it concerns the whole line. */
export interface CsvProblem {
  line: number;
  column: string;
  message: string;
}

/** One record: its trimmed cells and the file line it starts on. */
export interface CsvRecord {
  line: number;
  cells: string[];
}

/**
 * A problem as one line of text for people: `line 4, column use: expected …`, or
 * `line 4: …` when it concerns the whole line.
 */
export function csvProblemText(problem: CsvProblem): string {
  const where = problem.column === '' ? '' : `, column ${problem.column}`;
  return `line ${problem.line}${where}: ${problem.message}`;
}

interface Cursor {
  text: string;
  at: number;
  line: number;
}

/** A quoted field from its opening quote; the cursor ends after the closing quote. */
function quotedField(cursor: Cursor, problems: CsvProblem[], recordLine: number): string {
  let value = '';
  cursor.at += 1;
  for (;;) {
    const char = cursor.text[cursor.at];
    if (char === undefined) {
      problems.push({
        line: recordLine,
        column: '',
        message: 'a quoted field has no closing quote',
      });
      return value;
    }
    if (char === '"') {
      if (cursor.text[cursor.at + 1] !== '"') break;
      value += '"';
      cursor.at += 2;
      continue;
    }
    if (char === '\n') cursor.line += 1;
    value += char;
    cursor.at += 1;
  }
  cursor.at += 1;
  const rest = /^[^,\n]*/.exec(cursor.text.slice(cursor.at))?.[0] ?? '';
  if (rest.trim() !== '') {
    const message =
      'text after a closing quote: quote the whole field, and double a quote inside it';
    problems.push({ line: recordLine, column: '', message });
  }
  cursor.at += rest.length;
  return value;
}

function plainField(cursor: Cursor, problems: CsvProblem[], recordLine: number): string {
  const value = /^[^,\n]*/.exec(cursor.text.slice(cursor.at))?.[0] ?? '';
  cursor.at += value.length;
  if (value.includes('"')) {
    const message = 'a quote inside a field must be doubled ("") and the field quoted';
    problems.push({ line: recordLine, column: '', message });
  }
  return value;
}

/**
 * The records of a CSV text, with the line each starts on. Lines with no text in any field
 * are skipped; cells are trimmed; a byte-order mark and CR LF line ends are accepted.
 *
 * @param csvText - the file's text
 * @returns the records and the problems of quoting, at the line the record starts on
 *
 * References: RFC 4180, "Common Format and MIME Type for Comma-Separated Values (CSV) Files".
 */
export function readCsvRecords(csvText: string): { records: CsvRecord[]; problems: CsvProblem[] } {
  const cursor: Cursor = {
    text: csvText.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n'),
    at: 0,
    line: 1,
  };
  const records: CsvRecord[] = [];
  const problems: CsvProblem[] = [];
  while (cursor.at < cursor.text.length) {
    const line = cursor.line;
    const cells: string[] = [];
    for (;;) {
      const lead = /^[ \t]*/.exec(cursor.text.slice(cursor.at))?.[0] ?? '';
      const quoted = cursor.text[cursor.at + lead.length] === '"';
      if (quoted) cursor.at += lead.length;
      const field = quoted
        ? quotedField(cursor, problems, line)
        : plainField(cursor, problems, line);
      cells.push(field.trim());
      const separator = cursor.text[cursor.at];
      cursor.at += 1;
      if (separator !== ',') break;
    }
    cursor.line += 1;
    if (cells.some((cell) => cell !== '')) records.push({ line, cells });
  }
  return { records, problems };
}

/** The columns a kind of file may have and must have. */
export interface CsvTableSpec {
  /** The kind of file, for messages: `bills file`. */
  fileKind: string;
  /** Every column the file may have. */
  columns: readonly string[];
  /** Columns the header must have. */
  required: readonly string[];
  /** Groups of columns of which the header must have exactly one. */
  exactlyOneOf?: readonly (readonly string[])[];
}

/** A data row: its line and the text of each column the header names ('' when empty). */
export interface CsvRow {
  line: number;
  cells: ReadonlyMap<string, string>;
}

/** A file read against its columns: the columns the header has, the rows, every problem. */
export interface CsvTable {
  present: ReadonlySet<string>;
  rows: CsvRow[];
  problems: CsvProblem[];
}

function headerProblems(names: readonly string[], spec: CsvTableSpec): CsvProblem[] {
  const problems: CsvProblem[] = [];
  const at = (column: string, message: string) => problems.push({ line: 1, column, message });
  const seen = new Set<string>();
  for (const name of names) {
    if (name === '') continue;
    if (!spec.columns.includes(name)) {
      const near = spec.columns.find((known) => known.toLowerCase() === name.toLowerCase());
      const hint = near ? `did you mean "${near}"?` : `its columns are ${spec.columns.join(', ')}`;
      at(name, `is not a column of a ${spec.fileKind} (${hint})`);
    } else if (seen.has(name)) {
      at(name, 'appears twice in the header');
    }
    seen.add(name);
  }
  for (const name of spec.required) {
    if (!seen.has(name)) at(name, 'is required: the header has no such column');
  }
  for (const group of spec.exactlyOneOf ?? []) {
    const given = group.filter((name) => seen.has(name));
    if (given.length === 0)
      at(group[0] ?? '', `is required: the header needs ${group.join(' or ')}`);
    if (given.length > 1) at(given[1] ?? '', `give one of ${group.join(' or ')}, not both`);
  }
  return problems;
}

/**
 * A CSV file read as a table of known columns.
 *
 * @param csvText - the file's text: a header row of column names, then one row per item
 * @param spec - the columns the file may and must have
 * @returns the columns present, the data rows with their lines, and every problem of the
 *   text and the header (rows' own cells are the caller's to check)
 */
export function readCsvTable(csvText: string, spec: CsvTableSpec): CsvTable {
  const { records, problems } = readCsvRecords(csvText);
  const [header, ...dataRecords] = records;
  if (!header) {
    const message = `the file is empty: expected a header row (${spec.columns.join(',')}), then the rows`;
    return { present: new Set(), rows: [], problems: [{ line: 1, column: '', message }] };
  }
  problems.push(...headerProblems(header.cells, spec));
  const present = new Set(header.cells.filter((name) => spec.columns.includes(name)));
  const rows = dataRecords.map((record): CsvRow => {
    const extra = record.cells.slice(header.cells.length).filter((cell) => cell !== '');
    if (extra.length > 0) {
      const message = `has ${record.cells.length} fields; the header names ${header.cells.length}`;
      problems.push({ line: record.line, column: '', message });
    }
    const cells = new Map<string, string>();
    header.cells.forEach((name, index) => {
      if (present.has(name) && !cells.has(name)) cells.set(name, record.cells[index] ?? '');
    });
    return { line: record.line, cells };
  });
  return { present, rows, problems };
}
