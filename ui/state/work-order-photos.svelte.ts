/**
 * A photo as it is being attached: the file chosen, what it is of (the home or one of its
 * measures), before, after or other, and a caption. The image goes to the store as base64
 * (photos.add), which checks its bytes (JPEG, PNG or WebP, at most 15 MiB); its refusals are
 * shown beside the box they name, in plain words.
 */
import { call } from '../bridge.ts';
import type { ChannelRequest } from '../../electron/channels.ts';
import { sentence } from './work-order.svelte.ts';

export type PhotoKind = ChannelRequest<'photos.add'>['kind'];
type PhotoMediaType = NonNullable<ChannelRequest<'photos.add'>['mediaType']>;

const MEDIA_TYPES: readonly string[] = ['image/jpeg', 'image/png', 'image/webp'];

/** The largest image taken, bytes: the store's limit (db/repositories/photos.ts), 15 MiB. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

/** The kinds in words, in the order offered. */
export const PHOTO_KIND_WORDS: Readonly<Record<PhotoKind, string>> = {
  before: 'Before the work',
  after: 'After the work',
  other: 'Other',
};

/** The boxes a refusal can name. */
type PhotoBox = 'file' | 'measure' | 'kind' | 'caption' | 'form';

/** Where each of the store's field names is shown. */
const BOX_OF: Readonly<Record<string, PhotoBox>> = {
  base64: 'file',
  mediaType: 'file',
  measureId: 'measure',
  kind: 'kind',
  caption: 'caption',
};

/**
 * Bytes as standard base64 (RFC 4648 §4), in slices so a large photo does not overflow
 * `String.fromCharCode`'s argument list.
 */
export function base64OfBytes(bytes: Uint8Array): string {
  const SLICE = 0x8000;
  let binary = '';
  for (let start = 0; start < bytes.length; start += SLICE) {
    binary += String.fromCharCode(...bytes.subarray(start, start + SLICE));
  }
  return btoa(binary);
}

/** A size in words: "812 KB", "3.4 MB". */
export function sizeWords(byteCount: number): string {
  if (byteCount < 1024 * 1024) return `${Math.max(1, Math.round(byteCount / 1024))} KB`;
  return `${(byteCount / (1024 * 1024)).toFixed(1)} MB`;
}

export class PhotoAdding {
  readonly homeId: number;
  file = $state.raw<File | null>(null);
  /** '' for the home itself, else a measure's id. */
  measureId = $state('');
  kind = $state<PhotoKind>('before');
  caption = $state('');
  adding = $state(false);
  errors = $state<Partial<Record<PhotoBox, string>>>({});
  /** What was last done, in words, for the status line. */
  done = $state('');

  hasUnsaved = $derived(this.file !== null || this.caption.trim() !== '');

  constructor(homeId: number) {
    this.homeId = homeId;
  }

  choose(file: File | null): void {
    this.file = file;
    this.errors = {};
  }

  /**
   * Sends the chosen file to the store.
   *
   * @returns true when it was added (the form is then cleared)
   */
  async add(): Promise<boolean> {
    const file = this.file;
    if (this.adding) return false;
    if (file === null) {
      this.errors = { file: 'Choose a photo first: a JPEG, PNG or WebP image.' };
      return false;
    }
    if (file.size > MAX_PHOTO_BYTES) {
      this.errors = {
        file: `This file is ${sizeWords(file.size)}; a photo may be at most 15 MB. Make it smaller and try again.`,
      };
      return false;
    }
    this.adding = true;
    let base64: string;
    try {
      base64 = base64OfBytes(new Uint8Array(await file.arrayBuffer()));
    } catch {
      this.adding = false;
      this.errors = { file: 'The file could not be read. Choose it again.' };
      return false;
    }
    const caption = this.caption.trim();
    const reply = await call('photos.add', {
      homeId: this.homeId,
      kind: this.kind,
      base64,
      ...(this.measureId === '' ? {} : { measureId: this.measureId }),
      ...(caption === '' ? {} : { caption }),
      ...(MEDIA_TYPES.includes(file.type) ? { mediaType: file.type as PhotoMediaType } : {}),
    });
    this.adding = false;
    if (!reply.ok) {
      this.errors = placedProblems(reply.error);
      return false;
    }
    this.done = `Added the photo ${file.name}.`;
    this.file = null;
    this.caption = '';
    this.errors = {};
    return true;
  }

  /**
   * Removes a stored photo (after the screen's confirmation).
   *
   * @returns null when removed, else why not
   */
  async remove(photoId: number, words: string): Promise<string | null> {
    const reply = await call('photos.remove', { id: photoId });
    if (!reply.ok) return `The photo was not removed. ${reply.error.message}`;
    this.done = `Removed ${words}.`;
    return null;
  }
}

/** A refusal's problems placed on the boxes they name; the rest on the form. */
function placedProblems(error: {
  message: string;
  problems?: readonly { path: string; message: string }[] | undefined;
}): Partial<Record<PhotoBox, string>> {
  const placed: Partial<Record<PhotoBox, string>> = {};
  for (const problem of error.problems ?? []) {
    const box = BOX_OF[problem.path] ?? 'form';
    const words =
      problem.path === 'base64' && /JPEG, PNG or WebP/.test(problem.message)
        ? 'This file is not a photo Sealwork can keep: choose a JPEG, PNG or WebP image.'
        : sentence(problem.message);
    placed[box] = placed[box] === undefined ? words : `${placed[box]} ${words}`;
  }
  if (Object.keys(placed).length === 0) placed.form = sentence(error.message);
  return placed;
}
