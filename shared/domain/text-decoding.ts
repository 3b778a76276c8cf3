/**
 * Bytes of a text file to text, for the files loggers and spreadsheets export: UTF-8 with or
 * without a byte-order mark, UTF-16 (little or big endian) with a byte-order mark, and Latin-1
 * (read as Windows-1252, its superset, as browsers do). Uses the standard `TextDecoder`, which
 * browsers and Node both have; no I/O.
 */

import { EngineInputError } from './errors';

/** The encodings {@link decodeTextBytes} tells apart. */
export type TextEncodingName = 'utf-8' | 'utf-8 with BOM' | 'utf-16le' | 'utf-16be' | 'latin-1';

/** What {@link decodeTextBytes} read. */
export interface DecodedText {
  /** The text, without a byte-order mark. */
  text: string;
  encoding: TextEncodingName;
}

/**
 * Decodes a text file's bytes. A byte-order mark decides (UTF-8, UTF-16 LE, UTF-16 BE); without
 * one, bytes that are valid UTF-8 are UTF-8 and anything else is Latin-1 (Windows-1252), the
 * usual export encoding of older European Windows tools (e.g. "Zeit (s);Spannung (V)" with µ or
 * °). UTF-16 without a byte-order mark is recognised from its zero bytes (every other byte of
 * ASCII text).
 *
 * @param bytes - the file as read
 * @returns the text and the encoding found
 * @throws EngineInputError('invalid-csv') when the bytes hold zero characters that no text
 *   encoding explains (a binary file such as a spreadsheet workbook)
 * @example
 * decodeTextBytes(new Uint8Array([0xff, 0xfe, 0x74, 0x00, 0x2c, 0x00, 0x76, 0x00]))
 * // { text: 't,v', encoding: 'utf-16le' }
 */
export function decodeTextBytes(bytes: Uint8Array): DecodedText {
  const b0 = bytes[0];
  const b1 = bytes[1];
  if (b0 === 0xef && b1 === 0xbb && bytes[2] === 0xbf) {
    return checked(decode('utf-8', bytes.subarray(3)), 'utf-8 with BOM');
  }
  if (b0 === 0xff && b1 === 0xfe) return checked(decode('utf-16le', bytes.subarray(2)), 'utf-16le');
  if (b0 === 0xfe && b1 === 0xff) return checked(decode('utf-16be', bytes.subarray(2)), 'utf-16be');
  const wide = utf16WithoutMark(bytes);
  if (wide) return checked(decode(wide, bytes), wide);
  try {
    return checked(
      new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(bytes),
      'utf-8',
    );
  } catch {
    return checked(decode('windows-1252', bytes), 'latin-1');
  }
}

function decode(label: string, bytes: Uint8Array): string {
  // ignoreBOM: the mark was already taken off (or there is none); keep the text as it is.
  return new TextDecoder(label, { ignoreBOM: true }).decode(bytes);
}

/** Zero bytes at every odd (LE) or every even (BE) place of the first bytes: UTF-16 text. */
function utf16WithoutMark(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  const length = Math.min(bytes.length, 512) & ~1;
  if (length < 4) return null;
  let evenZeros = 0;
  let oddZeros = 0;
  for (let i = 0; i < length; i += 2) {
    if (bytes[i] === 0) evenZeros++;
    if (bytes[i + 1] === 0) oddZeros++;
  }
  const pairs = length / 2;
  if (oddZeros > 0.8 * pairs && evenZeros < 0.1 * pairs) return 'utf-16le';
  if (evenZeros > 0.8 * pairs && oddZeros < 0.1 * pairs) return 'utf-16be';
  return null;
}

function checked(text: string, encoding: TextEncodingName): DecodedText {
  const zeroAt = text.indexOf('\u0000');
  if (zeroAt >= 0) {
    const row = countLines(text, zeroAt);
    throw new EngineInputError(
      'invalid-csv',
      `Row ${row}: the file holds a zero byte, so it is not a text file (a spreadsheet workbook or a logger's binary format?). Export it as CSV text.`,
      [{ path: `row ${row}`, message: 'zero byte: not a text file' }],
    );
  }
  return { text, encoding };
}

function countLines(text: string, upTo: number): number {
  let row = 1;
  for (let i = 0; i < upTo; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) row++;
  }
  return row;
}
