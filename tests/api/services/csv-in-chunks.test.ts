import { describe, expect, it } from 'vitest';
import { readCsvInChunks } from '../../../api/src/services/csv-in-chunks';

const header = 'a,b';
const lines = (n: number, line: (i: number) => string) => Array.from({ length: n }, (_, i) => line(i)).join('\n');

describe('readCsvInChunks', () => {
  it('when rows and quoted line breaks straddle the slices, then every row reads whole', async () => {
    const text = `${header}\n${lines(40, (i) => `${i},"x\ny ${i}"`)}\n`;
    const read = await readCsvInChunks(text, { maxRows: 100, sliceCharacters: 16 });
    expect(read.fields).toEqual(['a', 'b']);
    expect(read.rows).toHaveLength(40);
    expect(read.rows[39]).toEqual({ a: '39', b: 'x\ny 39' });
    expect(read.overRowLimit).toBe(false);
  });

  it('when rows have too few or too many cells in later slices, then each error names its data row', async () => {
    // twelve good rows first, so the delimiter is plain from the start of the file
    const text = `${header}\n${lines(12, (i) => `${i},ok`)}\n3\n${lines(8, (i) => `${i},ok`)}\n4,5,6\n`;
    const read = await readCsvInChunks(text, { maxRows: 100, sliceCharacters: 16 });
    expect(read.errors.map((e) => [e.dataIndex, e.code])).toEqual([
      [12, 'TooFewFields'],
      [21, 'TooManyFields'],
    ]);
  });

  it('when the file has exactly the row limit, then it all reads; one more row, and reading stops there', async () => {
    const exact = await readCsvInChunks(`${header}\n${lines(50, (i) => `${i},v`)}\n`, { maxRows: 50, sliceCharacters: 64 });
    expect([exact.rows.length, exact.overRowLimit]).toEqual([50, false]);
    const over = await readCsvInChunks(`${header}\n${lines(51, (i) => `${i},v`)}\n`, { maxRows: 50, sliceCharacters: 64 });
    expect([over.rows.length, over.overRowLimit]).toEqual([50, true]);
  });

  it('when a million rows follow the header, then at most the limit is kept and the errors of rows past it are not', async () => {
    const read = await readCsvInChunks(`${header}\n${'x\n'.repeat(1_000_000)}`, { maxRows: 5000 });
    expect(read.overRowLimit).toBe(true);
    expect(read.rows).toHaveLength(5000);
    const rowErrors = read.errors.filter((e) => e.dataIndex !== undefined);
    expect(rowErrors).toHaveLength(5000);
    expect(rowErrors.every((e) => e.dataIndex! < 5000)).toBe(true);
  });

  it('when a file spans many slices, then other work runs between them before the read is done', async () => {
    const text = `${header}\n${lines(2000, (i) => `${i},${'v'.repeat(40)}`)}\n`;
    let turns = 0;
    let reading = true;
    const count = () => {
      if (!reading) return;
      turns += 1;
      setImmediate(count);
    };
    setImmediate(count);
    const read = await readCsvInChunks(text, { maxRows: 5000, sliceCharacters: 4096 });
    reading = false;
    expect(read.rows).toHaveLength(2000);
    // about 90 KB in 4 KB slices: the event loop turned between the slices, not once at the end
    expect(turns).toBeGreaterThanOrEqual(10);
  });

  it('when the first slice is too short to show the delimiter, then the start of the file decides it', async () => {
    const read = await readCsvInChunks(`a;b\n${lines(30, (i) => `${i};x,y`)}\n`, { maxRows: 100, sliceCharacters: 8 });
    expect(read.errors).toEqual([]);
    expect(read.rows[29]).toEqual({ a: '29', b: 'x,y' });
  });

  it('when a header transform is given, then the fields come out transformed', async () => {
    const read = await readCsvInChunks('Site Code,AREA\nM,Line 2\n', { maxRows: 5, transformHeader: (h) => h.toLowerCase().replace(' ', '_') });
    expect(read.rows).toEqual([{ site_code: 'M', area: 'Line 2' }]);
  });
});
