/**
 * A plain-text document as a PDF: monospaced lines on US Letter pages, so a column layout made
 * for the terminal (the work order's text) prints as it reads. No browser and no library: the
 * file is written by hand to the PDF 1.4 syntax, with the standard Courier font every reader
 * has (no font is embedded) in its WinAnsi encoding; characters outside it become "?".
 *
 * References: ISO 32000-1:2008 (PDF 1.7) §7.3 objects, §7.5 file structure and cross-reference
 * table, §9.6.2.2 the standard 14 fonts, Annex D.2 WinAnsiEncoding.
 */

/** US Letter, in points (1/72 in). */
const PAGE_WIDTH_PT = 612;
const PAGE_HEIGHT_PT = 792;
const MARGIN_PT = 54;
const FONT_SIZE_PT = 7.5;
const LEADING_PT = 9.5;
/** Courier's every glyph is 600/1000 of the font size wide (its AFM metrics). */
const COURIER_ADVANCE = 0.6;

/** Characters a line holds, and lines a page. */
export const PDF_LINE_CHARS = Math.floor(
  (PAGE_WIDTH_PT - 2 * MARGIN_PT) / (FONT_SIZE_PT * COURIER_ADVANCE),
);
export const PDF_PAGE_LINES = Math.floor((PAGE_HEIGHT_PT - 2 * MARGIN_PT) / LEADING_PT);

/** WinAnsi's codes 0x80–0x9F, by the character they stand for (ISO 32000-1 Annex D.2). */
const WIN_ANSI_HIGH: Readonly<Record<string, number>> = {
  '€': 0x80,
  '‚': 0x82,
  ƒ: 0x83,
  '„': 0x84,
  '…': 0x85,
  '†': 0x86,
  '‡': 0x87,
  ˆ: 0x88,
  '‰': 0x89,
  Š: 0x8a,
  '‹': 0x8b,
  Œ: 0x8c,
  Ž: 0x8e,
  '‘': 0x91,
  '’': 0x92,
  '“': 0x93,
  '”': 0x94,
  '•': 0x95,
  '–': 0x96,
  '—': 0x97,
  '˜': 0x98,
  '™': 0x99,
  š: 0x9a,
  '›': 0x9b,
  œ: 0x9c,
  ž: 0x9e,
  Ÿ: 0x9f,
};

/** Spelled out where WinAnsi has no glyph (common in the engine's wording). */
const SPELLED: Readonly<Record<string, string>> = {
  '≥': '>=',
  '≤': '<=',
  '≠': '!=',
  '→': '->',
  '←': '<-',
  '√': 'sqrt',
  '⁺': '+',
  '₂': '2',
  '\u2212': '-', // minus sign
  '\u2009': ' ', // thin space
  '\u202f': ' ', // narrow no-break space (number formats)
  '≈': '~',
};

/** One line of text as a PDF string literal's bytes (octal escapes above ASCII). */
function pdfString(line: string): string {
  let out = '';
  for (const character of line) {
    const spelled = SPELLED[character];
    if (spelled !== undefined) {
      out += pdfString(spelled);
      continue;
    }
    const code = character.codePointAt(0) ?? 0x3f;
    const byte =
      code >= 0x20 && code < 0x7f
        ? code
        : code >= 0xa0 && code <= 0xff
          ? code
          : (WIN_ANSI_HIGH[character] ?? 0x3f);
    if (byte === 0x28 || byte === 0x29 || byte === 0x5c) out += `\\${String.fromCharCode(byte)}`;
    else if (byte < 0x80) out += String.fromCharCode(byte);
    else out += `\\${byte.toString(8).padStart(3, '0')}`;
  }
  return out;
}

/** Lines folded to the page's width at spaces where they can be, keeping their indent. */
export function foldLines(text: string, width = PDF_LINE_CHARS): string[] {
  const folded: string[] = [];
  for (const raw of text.replace(/\t/g, '    ').split(/\r?\n/)) {
    let line = raw.trimEnd();
    const indent = ' '.repeat(Math.min(line.length - line.trimStart().length, width / 2));
    while ([...line].length > width) {
      const chars = [...line];
      let cut = chars.lastIndexOf(' ', width);
      if (cut <= indent.length) cut = width;
      folded.push(chars.slice(0, cut).join('').trimEnd());
      line = indent + chars.slice(cut).join('').trimStart();
    }
    folded.push(line);
  }
  return folded;
}

/**
 * The text as a PDF file.
 *
 * @param text - the document, lines separated by newlines (folded to the page's width)
 * @param title - the document's title (its metadata, and a page footer)
 * @returns the file's bytes
 */
export function textPdf(text: string, title: string): Uint8Array {
  const lines = foldLines(text);
  const pages: string[][] = [];
  for (let first = 0; first < lines.length; first += PDF_PAGE_LINES - 2) {
    pages.push(lines.slice(first, first + PDF_PAGE_LINES - 2));
  }
  if (pages.length === 0) pages.push([]);

  // Objects: 1 catalog, 2 page tree, 3 font, 4 info, then a page and its contents per page.
  const objects: string[] = [];
  const pageIds = pages.map((_, index) => 5 + 2 * index);
  objects[1] = '<< /Type /Catalog /Pages 2 0 R >>';
  objects[2] = `<< /Type /Pages /Kids [${pageIds.map((id) => `${id} 0 R`).join(' ')}] /Count ${pages.length} >>`;
  objects[3] = '<< /Type /Font /Subtype /Type1 /BaseFont /Courier /Encoding /WinAnsiEncoding >>';
  objects[4] = `<< /Title (${pdfString(title)}) /Producer (Sealwork) >>`;
  pages.forEach((pageLines, index) => {
    const top = PAGE_HEIGHT_PT - MARGIN_PT - FONT_SIZE_PT;
    const footer = `${title} - page ${index + 1} of ${pages.length}`;
    const content = [
      'BT',
      `/F1 ${FONT_SIZE_PT} Tf`,
      `${LEADING_PT} TL`,
      `${MARGIN_PT} ${top} Td`,
      ...pageLines.map((line) => `(${pdfString(line)}) '`),
      'ET',
      'BT',
      `/F1 ${FONT_SIZE_PT} Tf`,
      `${MARGIN_PT} ${MARGIN_PT / 2} Td`,
      `(${pdfString(footer)}) Tj`,
      'ET',
    ].join('\n');
    const pageId = pageIds[index] ?? 0;
    objects[pageId] =
      `<< /Type /Page /Parent 2 0 R /MediaBox [0 0 ${PAGE_WIDTH_PT} ${PAGE_HEIGHT_PT}] ` +
      `/Resources << /Font << /F1 3 0 R >> >> /Contents ${pageId + 1} 0 R >>`;
    objects[pageId + 1] =
      `<< /Length ${Buffer.byteLength(content, 'latin1')} >>\nstream\n${content}\nendstream`;
  });

  // Every string above is ASCII or latin-1 octal escapes, so one character is one byte.
  let file = '%PDF-1.4\n%\xe2\xe3\xcf\xd3\n';
  const offsets: number[] = [];
  for (let id = 1; id < objects.length; id += 1) {
    offsets[id] = Buffer.byteLength(file, 'latin1');
    file += `${id} 0 obj\n${objects[id]}\nendobj\n`;
  }
  const xref = Buffer.byteLength(file, 'latin1');
  file += `xref\n0 ${objects.length}\n0000000000 65535 f \n`;
  for (let id = 1; id < objects.length; id += 1) {
    file += `${String(offsets[id]).padStart(10, '0')} 00000 n \n`;
  }
  file += `trailer\n<< /Size ${objects.length} /Root 1 0 R /Info 4 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(file, 'latin1');
}
