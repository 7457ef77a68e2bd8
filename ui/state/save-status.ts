/** What the last save of an edited field did, for the status line under a form. */
export type SaveStatus =
  | { kind: 'idle' }
  | { kind: 'saving'; label: string }
  | { kind: 'saved'; label: string }
  | { kind: 'refused'; label: string; why: string }
  /** A new part of the home waits for more fields before it can be saved. */
  | { kind: 'waiting'; label: string; why: string };
