/**
 * A home file with its photos: the optional attachment bundle of the home-file export. The
 * home file itself (`sealwork-home/1`, core/schema.ts) stays as it is; the bundle carries it
 * beside the home's photos, each as base64 with its SHA-256, so a copy can be checked byte for
 * byte and a photo of a measure finds its measure again by the measure's id in the file.
 */
import { z } from 'zod';
import { InputError } from '../core/errors.ts';
import type { HomeFile } from '../core/schema.ts';
import { exportHomeFile, importHomeFile } from './home-file.ts';
import {
  addPhoto,
  getPhoto,
  listPhotos,
  MAX_PHOTO_BYTES,
  PHOTO_KINDS,
  PHOTO_MEDIA_TYPES,
  sha256Of,
} from './repositories/photos.ts';
import type { ReadAccess, WriteAccess } from './store.ts';
import { validated } from './repositories/_rows.ts';

export const HOME_BUNDLE_FORMAT = 'sealwork-home-bundle/1';

/** The most photos a bundle carries. */
export const MAX_BUNDLE_PHOTOS = 500;

/** Base64 characters of the largest photo: 4 for every 3 bytes, padded. */
export const MAX_PHOTO_BASE64_CHARS = Math.ceil(MAX_PHOTO_BYTES / 3) * 4;

/**
 * Standard base64 (RFC 4648 §4), padded: the alphabet, then at most two "=". With the length a
 * multiple of four (checked beside it) that is exactly whole groups of four characters. One
 * flat character class: a pattern of nested groups overflows V8's stack on a photo's millions
 * of characters.
 */
const BASE64 = /^[A-Za-z0-9+/]*={0,2}$/;

export const photoAttachmentSchema = z.strictObject({
  measureId: z.string().min(1).max(64).optional(),
  kind: z.enum(PHOTO_KINDS),
  caption: z.string().trim().min(1).max(500).optional(),
  mediaType: z.enum(PHOTO_MEDIA_TYPES),
  sha256: z
    .string()
    .regex(/^[0-9a-f]{64}$/, 'expected 64 lowercase hexadecimal digits')
    .optional(),
  base64: z.string().min(1).max(MAX_PHOTO_BASE64_CHARS),
});
export type PhotoAttachment = z.output<typeof photoAttachmentSchema>;

export const homeFileBundleSchema = z.strictObject({
  format: z.literal(HOME_BUNDLE_FORMAT),
  /** Checked by core's parseHomeFile on import. */
  file: z.unknown(),
  photos: z.array(photoAttachmentSchema).max(MAX_BUNDLE_PHOTOS),
});

export interface HomeFileBundle {
  format: typeof HOME_BUNDLE_FORMAT;
  file: HomeFile;
  photos: PhotoAttachment[];
}

/**
 * The bytes of base64 text.
 *
 * @param field - the field to name when the text is not base64
 * @throws InputError at `field` for text that is not padded standard base64
 */
export function bytesOfBase64(text: string, field: string): Buffer {
  if (text.length % 4 !== 0 || !BASE64.test(text)) {
    throw InputError.at(field, 'expected standard base64 (A–Z, a–z, 0–9, +, /, padded with =)');
  }
  return Buffer.from(text, 'base64');
}

/**
 * A stored home as a home file with its photos; an hourly home's file carries its weather
 * year (exportHomeFile's `withWeatherYear`), as a bundle is made to be taken elsewhere.
 *
 * @throws InputError naming each part the home still lacks (as exportHomeFile)
 */
export function exportHomeFileWithAttachments(read: ReadAccess, homeId: number): HomeFileBundle {
  const file = exportHomeFile(read, homeId, { withWeatherYear: true });
  const photos = listPhotos(read, homeId).map((summary): PhotoAttachment => {
    const photo = getPhoto(read, summary.id);
    return {
      ...(photo.measureId === null ? {} : { measureId: photo.measureId }),
      kind: photo.kind,
      ...(photo.caption === null ? {} : { caption: photo.caption }),
      mediaType: photo.mediaType,
      sha256: photo.sha256,
      base64: photo.bytes.toString('base64'),
    };
  });
  return { format: HOME_BUNDLE_FORMAT, file, photos };
}

/** An InputError of one photo moved under `photos[index]`, its `bytes` named `base64`. */
function underPhoto(error: InputError, index: number): InputError {
  return new InputError(
    error.problems.map((problem) => {
      const field = problem.path === 'bytes' ? 'base64' : problem.path;
      return {
        path: field === '' ? `photos[${index}]` : `photos[${index}].${field}`,
        message: problem.message,
      };
    }),
  );
}

/**
 * Stores a bundle as a new home with its photos, all or nothing (within the caller's write).
 *
 * @returns the new home's id
 * @throws InputError naming the field at fault: the bundle's (`format`, `photos[i].base64`,
 *   `photos[i].sha256`, `photos[i].measureId`, …) or the home file's, as importHomeFile does
 */
export function importHomeFileWithAttachments(
  write: WriteAccess,
  input: unknown,
  options: { newClient?: boolean } = {},
): number {
  const bundle = validated(homeFileBundleSchema, input);
  const decoded = bundle.photos.map((photo, index) => {
    const bytes = bytesOfBase64(photo.base64, `photos[${index}].base64`);
    if (photo.sha256 !== undefined && sha256Of(bytes) !== photo.sha256) {
      throw InputError.at(`photos[${index}].sha256`, 'expected the SHA-256 of the photo’s bytes');
    }
    return bytes;
  });
  const homeId = importHomeFile(write, bundle.file, options);
  bundle.photos.forEach((photo, index) => {
    const { base64: _base64, sha256: _sha256, ...fields } = photo;
    try {
      addPhoto(write, homeId, fields, decoded[index] ?? Buffer.alloc(0));
    } catch (error) {
      if (error instanceof InputError) throw underPhoto(error, index);
      throw error;
    }
  });
  return homeId;
}
