/**
 * The keyboard shortcuts of the screens: what each key does, in the words the help list
 * shows, and which action a key press asks for. Every shortcut repeats something a link or
 * a button also does; none is the only way to an action.
 */
import { SECTIONS, type SectionSlug } from './state/route.svelte.ts';

export type ShortcutAction =
  { kind: 'homes' } | { kind: 'section'; slug: SectionSlug } | { kind: 'undo' } | { kind: 'help' };

export interface ShortcutWords {
  keys: readonly string[];
  words: string;
}

/** The list the help panel shows, in its order. */
export const SHORTCUT_LIST: readonly ShortcutWords[] = [
  { keys: ['?'], words: 'Show this list of shortcuts (outside a text box)' },
  { keys: ['Esc'], words: 'Close this list, or a confirmation' },
  { keys: ['Alt', '0'], words: 'Go to the Homes list' },
  {
    keys: ['Alt', `1…${SECTIONS.length}`],
    words: `Go to a section of the open home: ${SECTIONS.map(
      (section, index) => `${index + 1} ${section.name}`,
    ).join(', ')}`,
  },
  {
    keys: ['Ctrl', 'Z'],
    words:
      'Undo the open home’s last saved edit, or on the Homes list the last deletion (outside a text box; inside one, it undoes typing as usual). ⌘ Z on a Mac.',
  },
  { keys: ['Tab'], words: 'Move to the next control; Shift Tab to the one before' },
  { keys: ['Enter'], words: 'Follow a link, press a button, or save the box you are in' },
  { keys: ['Ctrl', 'P'], words: 'Print; on the Proposal or the Work order, that document alone' },
];

/** The parts of a key press the shortcuts look at. */
export interface KeyPress {
  key: string;
  /** The physical key (`Digit1`): Alt changes `key` on some keyboards (⌥1 is ¡ on a Mac). */
  code: string;
  altKey: boolean;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  /** Whether the focus is in a box that takes typing (text input, text area). */
  inTextBox: boolean;
}

/** The action a key press asks for, or null when it is not a shortcut. */
export function shortcutOf(press: KeyPress): ShortcutAction | null {
  const digit = /^Digit([0-9])$/.exec(press.code);
  if (press.altKey && !press.ctrlKey && !press.metaKey && digit !== null) {
    const index = Number(digit[1]);
    if (index === 0) return { kind: 'homes' };
    const section = SECTIONS[index - 1];
    return section === undefined ? null : { kind: 'section', slug: section.slug };
  }
  if (press.inTextBox) return null;
  const command = press.ctrlKey || press.metaKey;
  if (command && !press.altKey && !press.shiftKey && press.key.toLowerCase() === 'z') {
    return { kind: 'undo' };
  }
  if (press.key === '?' && !command && !press.altKey) return { kind: 'help' };
  return null;
}
