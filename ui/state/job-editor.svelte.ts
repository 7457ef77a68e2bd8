/**
 * A home's Job panel: where the job stands and its history (jobs.history), and the form that
 * moves it on (jobs.changeStatus). What is typed stays in the form until the store accepts
 * it; a refusal's words go beside the box they name (the status, the date, who, the reason).
 * "By" starts as the name in the settings (settings.get userName), the date as today. One
 * editor per home lives as long as the page (`jobEditorFor`), so a half-typed move survives
 * its row being closed and opened again.
 */
import { call } from '../bridge.ts';
import {
  allowedMoves,
  firstMove,
  localIsoDate,
  type JobHistoryReply,
  type JobMove,
} from '../job-stages.ts';
import { jobWords } from '../labels.ts';
import { sentence } from '../text.ts';

export type JobField = 'to' | 'at' | 'by' | 'reason';

export interface JobDraft {
  to: string;
  at: string;
  by: string;
  reason: string;
}

export type JobFormStatus =
  | { kind: 'idle' }
  | { kind: 'working' }
  | { kind: 'saved'; words: string }
  | { kind: 'refused'; words: string };

const FIELDS: readonly JobField[] = ['to', 'at', 'by', 'reason'];

/** The form's box a refusal's field path is about (`reason`, or `to` for a request's `to`). */
function fieldOf(path: string | undefined): JobField | null {
  const head = path?.split('.')[0];
  return FIELDS.find((field) => field === head) ?? null;
}

export class JobEditor {
  readonly homeId: number;
  history = $state.raw<JobHistoryReply | null>(null);
  failure = $state<string | null>(null);
  draft = $state<JobDraft>({ to: '', at: '', by: '', reason: '' });
  errors = $state<Partial<Record<JobField, string>>>({});
  status = $state<JobFormStatus>({ kind: 'idle' });

  /** The moves the rule allows from where the job stands, the next step forward first. */
  moves = $derived.by((): JobMove[] => (this.history === null ? [] : allowedMoves(this.history)));
  /** Whether the chosen move needs a reason (the store refuses it without one). */
  needsReason = $derived(
    this.moves.find((move) => move.to === this.draft.to)?.needsReason ?? false,
  );

  constructor(homeId: number, today: Date = new Date()) {
    this.homeId = homeId;
    this.draft.at = localIsoDate(today);
  }

  /** Reads the job's history and the name "By" starts with (a draft already typed is kept). */
  async load(): Promise<void> {
    const [history, settings] = await Promise.all([
      call('jobs.history', { homeId: this.homeId }),
      call('settings.get', {}),
    ]);
    // The word on a change saved earlier is news no more when the panel opens again (read
    // after the wait, so an effect that calls this does not track the status).
    if (this.status.kind === 'saved') this.status = { kind: 'idle' };
    if (settings.ok && this.draft.by === '') this.draft.by = settings.value.userName;
    if (!history.ok) {
      this.failure = history.error.message;
      return;
    }
    this.failure = null;
    this.#show(history.value);
  }

  edit(field: JobField, text: string): void {
    this.draft[field] = text;
  }

  /** Puts a history in view and the form on the first move it allows. */
  #show(history: JobHistoryReply): void {
    this.history = history;
    const kept = this.moves.some((move) => move.to === this.draft.to);
    if (!kept) this.draft.to = firstMove(this.moves)?.to ?? '';
  }

  /**
   * Asks the store to move the job as the form says.
   *
   * @returns true when the store recorded the change (the form is then ready for the next)
   */
  async submit(): Promise<boolean> {
    if (this.status.kind === 'working') return false;
    // The store judges the change (the rule's words name the box); the screen only needs a choice.
    if (this.draft.to === '') {
      this.errors = { to: 'Choose what the job moves to.' };
      this.status = { kind: 'refused', words: 'Not changed: see the marked box.' };
      return false;
    }
    this.status = { kind: 'working' };
    const reason = this.draft.reason.trim();
    const reply = await call('jobs.changeStatus', {
      homeId: this.homeId,
      to: this.draft.to,
      at: this.draft.at.trim(),
      by: this.draft.by.trim(),
      ...(reason === '' ? {} : { reason }),
    });
    if (!reply.ok) {
      const errors: Partial<Record<JobField, string>> = {};
      for (const problem of reply.error.problems ?? []) {
        const field = fieldOf(problem.path);
        if (field !== null) errors[field] ??= sentence(problem.message);
      }
      const named = fieldOf(reply.error.field);
      if (Object.keys(errors).length === 0 && named !== null) {
        errors[named] = sentence(reply.error.message);
      }
      this.errors = errors;
      const placed = Object.keys(errors).length > 0;
      this.status = {
        kind: 'refused',
        words: placed
          ? 'Not changed: see the marked box.'
          : `Not changed: ${sentence(reply.error.message)}`,
      };
      return false;
    }
    this.errors = {};
    this.draft.reason = '';
    this.status = {
      kind: 'saved',
      words: `The job is now ${jobWords(reply.value.entry.status).toLowerCase()}.`,
    };
    this.#show(reply.value.history);
    return true;
  }
}

const editors = new Map<number, JobEditor>();

/** The Job panel's editor of a home, made on first use and kept while the page lives. */
export function jobEditorFor(homeId: number): JobEditor {
  let editor = editors.get(homeId);
  if (editor === undefined) {
    editor = new JobEditor(homeId);
    editors.set(homeId, editor);
  }
  return editor;
}
