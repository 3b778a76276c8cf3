import { describe, expect, it } from 'vitest';
import { decodeTextBytes } from '../../../shared/domain/text-decoding';
import { EngineInputError } from '../../../shared/domain/errors';

const utf16 = (text: string, bigEndian: boolean, mark = true): Uint8Array => {
  const bytes = new Uint8Array((mark ? 2 : 0) + text.length * 2);
  const view = new DataView(bytes.buffer);
  if (mark) view.setUint16(0, 0xfeff, !bigEndian);
  for (let i = 0; i < text.length; i++)
    view.setUint16((mark ? 2 : 0) + i * 2, text.charCodeAt(i), !bigEndian);
  return bytes;
};

describe('decodeTextBytes', () => {
  it('when the bytes are plain UTF-8, then they are UTF-8', () => {
    expect(decodeTextBytes(new TextEncoder().encode('Temp (°C);µs'))).toEqual({
      text: 'Temp (°C);µs',
      encoding: 'utf-8',
    });
  });

  it('when UTF-8 starts with a byte-order mark, then the mark is taken off', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode('t,v')]);
    expect(decodeTextBytes(bytes)).toEqual({ text: 't,v', encoding: 'utf-8 with BOM' });
  });

  it('when UTF-16 has a byte-order mark, then both byte orders are read', () => {
    expect(decodeTextBytes(utf16('Zeit;Spannung\r\n', false))).toEqual({
      text: 'Zeit;Spannung\r\n',
      encoding: 'utf-16le',
    });
    expect(decodeTextBytes(utf16('Zeit;Spannung\r\n', true))).toEqual({
      text: 'Zeit;Spannung\r\n',
      encoding: 'utf-16be',
    });
  });

  it('when UTF-16 has no byte-order mark, then its zero bytes give it away', () => {
    expect(decodeTextBytes(utf16('t,v\n0,560\n', false, false)).encoding).toBe('utf-16le');
    expect(decodeTextBytes(utf16('t,v\n0,560\n', true, false)).encoding).toBe('utf-16be');
  });

  it('when the bytes are not UTF-8, then they are Latin-1 (Windows-1252)', () => {
    // "Gerät" and "°C" as an older Windows tool writes them: ä = 0xE4, ° = 0xB0 (ISO 8859-1).
    const bytes = Uint8Array.from('Gerät;Temp (°C)', (c) => c.charCodeAt(0));
    expect(decodeTextBytes(bytes)).toEqual({ text: 'Gerät;Temp (°C)', encoding: 'latin-1' });
  });

  it('when the bytes hold zero bytes no text encoding explains, then it is refused as not text, naming the row', () => {
    const bytes = new Uint8Array([
      ...new TextEncoder().encode('PK\n\nx'),
      0,
      0,
      0x14,
      0x06,
      0,
      0,
      0x08,
    ]);
    const error = (() => {
      try {
        decodeTextBytes(bytes);
      } catch (caught) {
        return caught;
      }
      return null;
    })();
    expect(error).toBeInstanceOf(EngineInputError);
    expect((error as EngineInputError).message).toMatch(
      /^Row 3: the file holds a zero byte, so it is not a text file/,
    );
  });
});
