/**
 * Made-up images for the photo tests, built here from the formats' own specifications rather
 * than read from a file: a PNG by ISO/IEC 15948 (signature, IHDR, one zlib IDAT, IEND, each
 * chunk with its CRC-32 of type and data, §5), and the first bytes of JPEG and WebP files
 * (JPEG: SOI FF D8 then the APP0 marker FF E0 and "JFIF", ITU-T T.81 Annex B and JFIF 1.02;
 * WebP: "RIFF", the little-endian size, "WEBP", "VP8L", Google's container specification).
 */
import { crc32, deflateSync } from 'node:zlib';

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typed));
  return Buffer.concat([length, typed, crc]);
}

/**
 * An 8-bit RGB PNG whose pixels follow a seeded pattern (every call with the same size and
 * seed gives the same bytes).
 *
 * @param widthPx - width, pixels
 * @param heightPx - height, pixels
 * @param seed - changes the pattern, so two photos differ
 */
export function pngImage(widthPx: number, heightPx: number, seed = 1): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(widthPx, 0);
  header.writeUInt32BE(heightPx, 4);
  header.set([8, 2, 0, 0, 0], 8); // bit depth 8, colour type 2 (RGB), deflate, filter 0, no interlace
  const rows: number[] = [];
  let state = seed >>> 0 || 1;
  for (let y = 0; y < heightPx; y += 1) {
    rows.push(0); // filter type None
    for (let x = 0; x < widthPx * 3; x += 1) {
      // xorshift32: bytes that do not compress away, so a large image stays large.
      state ^= state << 13;
      state ^= state >>> 17;
      state ^= state << 5;
      rows.push(state & 0xff);
    }
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(Buffer.from(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** The first bytes of a JFIF JPEG (SOI, APP0 "JFIF\0" version 1.02) and some made-up data. */
export function jpegStart(): Buffer {
  return Buffer.from([
    0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x02, 0x00, 0x00, 0x01,
    0x00, 0x01, 0x00, 0x00, 0xff, 0xd9,
  ]);
}

/** A RIFF WebP header ("RIFF", size, "WEBP", a "VP8L" chunk) with made-up data. */
export function webpStart(): Buffer {
  const body = Buffer.concat([Buffer.from('WEBPVP8L', 'latin1'), Buffer.alloc(12, 7)]);
  const size = Buffer.alloc(4);
  size.writeUInt32LE(body.length);
  return Buffer.concat([Buffer.from('RIFF', 'latin1'), size, body]);
}
