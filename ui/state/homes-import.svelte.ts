/**
 * Homes brought in from files: one home file (`sealwork-home/1`, JSON) stored as a new home,
 * and a portfolio CSV (one home a row) checked first, every problem shown at its line and
 * column, then imported whole or not at all. Files are read in the page (File.text()) and
 * their text goes to the store; nothing is written until the store has checked all of it.
 */
import { call } from '../bridge.ts';
import type { ChannelResponse } from '../../electron/channels.ts';

export type CsvProblem = ChannelResponse<'portfolio.checkCsv'>['problems'][number];

/** A problem of a home file, at its field's path (`house.bedrooms`), in the store's words. */
export interface FileProblem {
  path: string;
  message: string;
}

export type HomeFileOutcome =
  | { kind: 'idle' }
  | { kind: 'working'; fileName: string }
  | { kind: 'imported'; fileName: string; homeId: number; name: string }
  | { kind: 'refused'; fileName: string; words: string; problems: readonly FileProblem[] };

export type CsvOutcome =
  | { kind: 'idle' }
  | { kind: 'checking'; fileName: string }
  | { kind: 'ready'; fileName: string; names: readonly string[] }
  | { kind: 'problems'; fileName: string; rows: number; problems: readonly CsvProblem[] }
  | { kind: 'importing'; fileName: string; names: readonly string[] }
  | {
      kind: 'imported';
      fileName: string;
      homes: readonly { id: number; name: string }[];
    }
  | { kind: 'failed'; fileName: string; words: string };

/** The text of a chosen file, or the reason it could not be read, in words. */
async function textOf(file: File): Promise<{ text: string } | { problem: string }> {
  try {
    return { text: await file.text() };
  } catch {
    return {
      problem: `${file.name} could not be read. Check that it is still there and try again.`,
    };
  }
}

/** A home file's name as the file holds it, when it holds one. */
function nameInFile(json: unknown): string | null {
  if (typeof json !== 'object' || json === null || !('name' in json)) return null;
  return typeof json.name === 'string' ? json.name : null;
}

export class HomesImport {
  homeFile = $state<HomeFileOutcome>({ kind: 'idle' });
  csv = $state<CsvOutcome>({ kind: 'idle' });
  /** The checked CSV's text, imported as it was checked. */
  #csvText: string | null = null;

  /**
   * Reads a home file and stores it as a new home.
   *
   * @returns the new home's id, or null when the file was not read, not JSON, or refused
   */
  async importHomeFile(file: File): Promise<number | null> {
    const fileName = file.name;
    this.homeFile = { kind: 'working', fileName };
    const read = await textOf(file);
    if ('problem' in read) {
      this.homeFile = { kind: 'refused', fileName, words: read.problem, problems: [] };
      return null;
    }
    let json: unknown;
    try {
      json = JSON.parse(read.text);
    } catch (error) {
      const why = error instanceof Error ? error.message : String(error);
      this.homeFile = {
        kind: 'refused',
        fileName,
        words: `Nothing was imported: ${fileName} is not a JSON file (${why}). A home file is the JSON Sealwork writes for one home.`,
        problems: [],
      };
      return null;
    }
    const reply = await call('homeFile.import', { file: json });
    if (!reply.ok) {
      const problems = reply.error.problems ?? [];
      this.homeFile = {
        kind: 'refused',
        fileName,
        words:
          problems.length === 0
            ? `Nothing was imported from ${fileName}: ${reply.error.message}`
            : `Nothing was imported: ${fileName} is not a valid home file. ${
                problems.length === 1 ? 'One field needs' : `${problems.length} fields need`
              } a change:`,
        problems,
      };
      return null;
    }
    this.homeFile = {
      kind: 'imported',
      fileName,
      homeId: reply.value.id,
      name: nameInFile(json) ?? fileName,
    };
    return reply.value.id;
  }

  /** Reads a portfolio CSV and has the store check every row, writing nothing. */
  async checkCsv(file: File): Promise<void> {
    const fileName = file.name;
    this.#csvText = null;
    this.csv = { kind: 'checking', fileName };
    const read = await textOf(file);
    if ('problem' in read) {
      this.csv = { kind: 'failed', fileName, words: read.problem };
      return;
    }
    const reply = await call('portfolio.checkCsv', { csv: read.text });
    if (!reply.ok) {
      this.csv = {
        kind: 'failed',
        fileName,
        words: `${fileName} was not checked: ${reply.error.message}`,
      };
      return;
    }
    const plan = reply.value;
    if (plan.problems.length > 0) {
      this.csv = { kind: 'problems', fileName, rows: plan.rows, problems: plan.problems };
      return;
    }
    this.#csvText = read.text;
    this.csv = { kind: 'ready', fileName, names: plan.homes.map((home) => home.file.name) };
  }

  /**
   * Imports the checked CSV, every row or none.
   *
   * @returns the new homes' ids (none when the store refused)
   */
  async importCsv(): Promise<number[]> {
    const checked = this.csv;
    const text = this.#csvText;
    if (checked.kind !== 'ready' || text === null) return [];
    const { fileName, names } = checked;
    this.csv = { kind: 'importing', fileName, names };
    const reply = await call('portfolio.importCsv', { csv: text });
    if (!reply.ok) {
      this.csv = {
        kind: 'failed',
        fileName,
        words: `Nothing was imported: ${reply.error.message}`,
      };
      return [];
    }
    // Checked again as it was written: a stored climate or price set it names may have gone since.
    if (reply.value.problems.length > 0) {
      this.#csvText = null;
      this.csv = { kind: 'problems', fileName, rows: names.length, problems: reply.value.problems };
      return [];
    }
    this.#csvText = null;
    this.csv = {
      kind: 'imported',
      fileName,
      homes: reply.value.ids.map((id, index) => ({ id, name: names[index] ?? `Home ${id}` })),
    };
    return reply.value.ids;
  }

  /** Forgets a checked CSV that was not imported. */
  forgetCsv(): void {
    this.#csvText = null;
    this.csv = { kind: 'idle' };
  }
}
