/**
 * A home's bills and daily temperatures as the Bills panel keeps them: what is stored,
 * the last file's problems, and the last analysis (fits before and after the work, the
 * measured savings beside the plan's estimate). Files are read in the page and sent as text.
 */
import { call } from '../bridge.ts';
import type { ChannelResponse, Reply } from '../../electron/channels.ts';

export type BillsListing = ChannelResponse<'bills.list'>;
export type BillsAnalysis = ChannelResponse<'bills.analyse'>;
export type BillsCsvProblem = ChannelResponse<'bills.import'>['problems'][number];
export type TemperatureSource = 'stored' | 'weatherYear';

/** A refused file: its name and its problems by line and column. */
export interface RefusedFile {
  fileName: string;
  problems: readonly BillsCsvProblem[];
}

/** What a refused file's status line says. */
function refusedWords(fileName: string, count: number): string {
  return `${fileName} was not stored: ${count} problem${count === 1 ? '' : 's'}, listed below.`;
}

export class BillsState {
  readonly homeId: number;
  listing = $state.raw<BillsListing | null>(null);
  analysis = $state.raw<BillsAnalysis | null>(null);
  refused = $state.raw<RefusedFile | null>(null);
  /** What the last action did, in words (read out by the page's status line). */
  status = $state('');
  failure = $state<string | null>(null);
  workDone = $state('');
  source = $state<TemperatureSource>('stored');
  busy = $state(false);

  constructor(homeId: number, workDone: string) {
    this.homeId = homeId;
    this.workDone = workDone;
  }

  async load(): Promise<void> {
    const reply = await call('bills.list', { homeId: this.homeId });
    if (!reply.ok) {
      this.failure = reply.error.message;
      return;
    }
    this.listing = reply.value;
    // The home's own series when it has one, else its climate's weather year.
    if (reply.value.temperatures.days === 0 && reply.value.weatherYear !== null)
      this.source = 'weatherYear';
  }

  async importBills(file: File): Promise<void> {
    await this.#importCsv(
      file,
      (csv) => call('bills.import', { homeId: this.homeId, csv }),
      (value) => `Stored ${value.count} bills from ${file.name}.`,
    );
  }

  async importTemperatures(file: File): Promise<void> {
    const stored = await this.#importCsv(
      file,
      (csv) => call('bills.importTemperatures', { homeId: this.homeId, csv }),
      (value) => `Stored ${value.days} days of temperatures from ${file.name}.`,
    );
    if (stored) this.source = 'stored';
  }

  /**
   * One CSV file through its channel: refused whole (its problems listed) or stored, then the
   * bills read again. Returns whether it was stored.
   */
  async #importCsv<Value extends { problems: BillsCsvProblem[] }>(
    file: File,
    send: (csv: string) => Promise<Reply<Value>>,
    storedWords: (value: Value) => string,
  ): Promise<boolean> {
    this.status = `Reading ${file.name}…`;
    const reply = await send(await file.text());
    if (!reply.ok) {
      this.failure = `${file.name} was not stored. ${reply.error.message}`;
      this.status = '';
      return false;
    }
    if (reply.value.problems.length > 0) {
      this.refused = { fileName: file.name, problems: reply.value.problems };
      this.status = refusedWords(file.name, reply.value.problems.length);
      return false;
    }
    this.refused = null;
    this.failure = null;
    this.analysis = null;
    this.status = storedWords(reply.value);
    await this.load();
    return true;
  }

  async analyse(): Promise<void> {
    this.busy = true;
    const reply = await call('bills.analyse', {
      homeId: this.homeId,
      workDone: this.workDone,
      temperatures: this.source,
    });
    this.busy = false;
    if (!reply.ok) {
      this.analysis = null;
      this.failure = `The bills could not be fitted. ${reply.error.message}`;
      return;
    }
    this.failure = null;
    this.analysis = reply.value;
    this.status = 'Fitted the bills before and after the work.';
  }

  async clear(): Promise<void> {
    const reply = await call('bills.clear', { homeId: this.homeId, temperatures: true });
    if (!reply.ok) {
      this.failure = reply.error.message;
      return;
    }
    this.analysis = null;
    this.refused = null;
    this.status = `Removed ${reply.value.bills} bills and ${reply.value.days} days of temperatures.`;
    await this.load();
  }
}
