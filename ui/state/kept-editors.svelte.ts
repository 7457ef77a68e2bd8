/**
 * Editors kept while the page is open, so what is typed in a form survives leaving its
 * screen and coming back. Each is made under a root of its own: made inside a component, its
 * derived values would stop following the store once that component is gone.
 */
import { SvelteMap } from 'svelte/reactivity';

/** An editor holding typed text that may not be saved yet. */
export interface HoldsDrafts {
  readonly hasUnsaved: boolean;
}

export class KeptEditors {
  #editors = new SvelteMap<string, HoldsDrafts>();

  /** Whether any kept editor holds typed text not saved yet. */
  hasUnsaved = $derived([...this.#editors.values()].some((editor) => editor.hasUnsaved));

  /**
   * The editor kept under `key`, made by `make` the first time.
   *
   * @param key - which editor ("12/house", "settings")
   * @param make - makes the editor
   */
  editor<Editor extends HoldsDrafts>(key: string, make: () => Editor): Editor {
    const kept = this.#editors.get(key) as Editor | undefined;
    if (kept !== undefined) return kept;
    let made: Editor | undefined;
    $effect.root(() => {
      made = make();
    });
    if (made === undefined) throw new Error(`the editor ${key} was not made`);
    this.#editors.set(key, made);
    return made;
  }
}

/** The project's own editors (Settings, Library), outside any one home. */
export const projectEditors = new KeptEditors();
