/**
 * A home's photos, each optionally of one of its measures (by the measure's id in the home
 * file), before, after or other. The image is kept in the project file itself (a BLOB), so a
 * backup carries it; its SHA-256 is kept beside it, so a copy can be checked byte for byte.
 *
 * Only JPEG, PNG and WebP are taken, told by their first bytes (References: JPEG, ITU-T T.81
 * Annex B: the SOI marker FF D8 then a marker FF; PNG, ISO/IEC 15948 §5.2: the eight-byte
 * signature 89 50 4E 47 0D 0A 1A 0A; WebP, Google's RIFF container specification: "RIFF",
 * a four-byte size, then "WEBP"). A photo the type it claims is not is refused, not relabelled.
 */
import { createHash } from 'node:crypto';
import { z } from 'zod';
import { InputError } from '../../core/errors.ts';
import { classifySqliteError, DbError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { found, validated } from './_rows.ts';
import { getHome, touchHome } from './homes.ts';

export const PHOTO_KINDS = ['before', 'after', 'other'] as const;
export type PhotoKind = (typeof PHOTO_KINDS)[number];

export const PHOTO_MEDIA_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type PhotoMediaType = (typeof PHOTO_MEDIA_TYPES)[number];

/** The largest photo taken, bytes (15 MiB: a full-size phone photo is 2–8 MB; common practice). */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

/** What a photo is of, as given (the image itself apart). */
export const photoFieldsSchema = z.strictObject({
  measureId: z.string().min(1).max(64).optional(),
  kind: z.enum(PHOTO_KINDS),
  caption: z.string().trim().min(1).max(500).optional(),
  mediaType: z.enum(PHOTO_MEDIA_TYPES).optional(),
});
export type PhotoFields = z.input<typeof photoFieldsSchema>;

/** A stored photo without its bytes (what a list shows). */
export interface PhotoSummary {
  id: number;
  homeId: number;
  measureId: string | null;
  kind: PhotoKind;
  caption: string | null;
  mediaType: PhotoMediaType;
  byteCount: number;
  /** SHA-256 of the bytes, lowercase hex. */
  sha256: string;
  createdAt: string;
}

/** A stored photo with its bytes. */
export interface Photo extends PhotoSummary {
  bytes: Buffer;
}

interface PhotoRow {
  id: number;
  home_id: number;
  measure_key: string | null;
  kind: PhotoKind;
  caption: string | null;
  media_type: PhotoMediaType;
  byte_count: number;
  sha256: string;
  created_at: string;
  bytes?: Buffer;
}

function startsWith(bytes: Uint8Array, prefix: readonly number[], at = 0): boolean {
  return prefix.every((byte, index) => bytes[at + index] === byte);
}

const ascii = (text: string): number[] => [...text].map((char) => char.charCodeAt(0));

/**
 * The image type of some bytes, by their first bytes (see the module's References).
 *
 * @returns the media type, or null when the bytes are not a JPEG, PNG or WebP image
 */
export function photoMediaTypeOf(bytes: Uint8Array): PhotoMediaType | null {
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (bytes.length >= 12 && startsWith(bytes, ascii('RIFF')) && startsWith(bytes, ascii('WEBP'), 8))
    return 'image/webp';
  return null;
}

/** SHA-256 of some bytes, lowercase hex (FIPS 180-4, through node:crypto). */
export function sha256Of(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** The checked media type of a photo: the one its bytes have, which must be the one claimed. */
function checkedMediaType(bytes: Uint8Array, claimed: PhotoMediaType | undefined): PhotoMediaType {
  if (bytes.length === 0) throw InputError.at('bytes', 'expected an image, got no bytes');
  if (bytes.length > MAX_PHOTO_BYTES) {
    throw InputError.at(
      'bytes',
      `expected at most ${MAX_PHOTO_BYTES} bytes (15 MiB), got ${bytes.length}`,
    );
  }
  const actual = photoMediaTypeOf(bytes);
  if (actual === null) {
    throw InputError.at('bytes', 'expected a JPEG, PNG or WebP image (told by its first bytes)');
  }
  if (claimed !== undefined && claimed !== actual) {
    throw InputError.at('mediaType', `expected ${actual}: the bytes are that kind of image`);
  }
  return actual;
}

function checkMeasure(read: ReadAccess, homeId: number, measureId: string | undefined): void {
  if (measureId === undefined) return;
  const row = read
    .statement('SELECT 1 FROM measures WHERE home_id = ? AND key = ?')
    .get(homeId, measureId);
  if (row === undefined) {
    throw InputError.at(
      'measureId',
      `expected the id of one of the home's measures, got "${measureId}"`,
    );
  }
}

/**
 * Stores a photo of a home (or of one of its measures).
 *
 * @param fields - what it is of; `mediaType` is checked against the bytes, or taken from them
 * @param bytes - the image, at most {@link MAX_PHOTO_BYTES}
 * @returns the stored photo's id
 * @throws InputError naming `measureId`, `kind`, `caption`, `mediaType` or `bytes`; DbError
 *   notFound (`homeId`) for a missing home
 */
export function addPhoto(
  write: WriteAccess,
  homeId: number,
  fields: PhotoFields,
  bytes: Uint8Array,
): number {
  const photo = validated(photoFieldsSchema, fields);
  getHome(write, homeId);
  checkMeasure(write, homeId, photo.measureId);
  const mediaType = checkedMediaType(bytes, photo.mediaType);
  try {
    const result = write
      .statement(
        `INSERT INTO photos (home_id, measure_key, kind, caption, media_type, bytes, sha256, created_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        homeId,
        photo.measureId ?? null,
        photo.kind,
        photo.caption ?? null,
        mediaType,
        Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength),
        sha256Of(bytes),
        write.now,
      );
    touchHome(write, homeId);
    return Number(result.lastInsertRowid);
  } catch (error) {
    throw classifySqliteError(error, { check: 'bytes' }) ?? error;
  }
}

const SUMMARY_COLUMNS = `id, home_id, measure_key, kind, caption, media_type,
  length(bytes) AS byte_count, sha256, created_at`;

function summaryOf(row: PhotoRow): PhotoSummary {
  return {
    id: row.id,
    homeId: row.home_id,
    measureId: row.measure_key,
    kind: row.kind,
    caption: row.caption,
    mediaType: row.media_type,
    byteCount: row.byte_count,
    sha256: row.sha256,
    createdAt: row.created_at,
  };
}

/**
 * A home's photos in the order they were added, without their bytes.
 *
 * @throws DbError notFound (`homeId`) for a missing home
 */
export function listPhotos(read: ReadAccess, homeId: number): PhotoSummary[] {
  getHome(read, homeId);
  const rows = read
    .statement(`SELECT ${SUMMARY_COLUMNS} FROM photos WHERE home_id = ? ORDER BY id`)
    .all(homeId) as PhotoRow[];
  return rows.map(summaryOf);
}

/**
 * A photo with its bytes.
 *
 * @throws DbError notFound (`photoId`) when there is none; corrupt when its bytes no longer
 *   match the SHA-256 stored with them
 */
export function getPhoto(read: ReadAccess, photoId: number): Photo {
  const row = found(
    read.statement(`SELECT ${SUMMARY_COLUMNS}, bytes FROM photos WHERE id = ?`).get(photoId) as
      PhotoRow | undefined,
    `photo ${photoId}`,
    'photoId',
  );
  const bytes = row.bytes ?? Buffer.alloc(0);
  // A photo whose bytes changed since they were stored is reported, never passed on as good.
  if (sha256Of(bytes) !== row.sha256) {
    throw new DbError(
      'corrupt',
      `photo ${photoId} is damaged: its bytes do not match their SHA-256`,
      {
        field: 'photoId',
      },
    );
  }
  return { ...summaryOf(row), bytes };
}

/** Removes a photo; DbError notFound (`photoId`) when there is none. */
export function removePhoto(write: WriteAccess, photoId: number): void {
  const row = found(
    write.statement('SELECT home_id FROM photos WHERE id = ?').get(photoId) as
      { home_id: number } | undefined,
    `photo ${photoId}`,
    'photoId',
  );
  write.statement('DELETE FROM photos WHERE id = ?').run(photoId);
  touchHome(write, row.home_id);
}
