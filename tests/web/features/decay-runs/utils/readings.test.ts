import { describe, expect, it } from 'vitest';
import {
  readConditions,
  readDecimal,
  readPastedReadings,
  readReadingRows,
  readSeconds,
  withCell,
  withoutRow,
} from '../../../../../web/src/features/decay-runs/utils/readings';

const rows = (...pairs: [string, string][]) => pairs.map(([time, volts]) => ({ time, volts }));

describe('readDecimal', () => {
  it('when a decimal comma is typed, then it reads as a point', () => {
    expect(readDecimal(' 412,5 ')).toBe(412.5);
  });

  it('when the text is not a number, then null', () => {
    expect(readDecimal('4l2')).toBeNull();
    expect(readDecimal('1,2,3')).toBeNull();
    expect(readDecimal('')).toBeNull();
  });
});

describe('readSeconds', () => {
  it('when minutes and seconds are typed, then seconds', () => {
    expect(readSeconds('2:05')).toBe(125);
    expect(readSeconds('1:00:30')).toBe(3630);
  });

  it('when a part after the first is 60 or more, then null', () => {
    expect(readSeconds('1:75')).toBeNull();
  });
});

describe('readReadingRows', () => {
  it('when rows are well typed, then samples in seconds and volts with their screen rows; blank rows are skipped', () => {
    const read = readReadingRows(rows(['0', '560'], ['', ''], ['1:00', '428,5']));
    expect(read).toEqual({
      samples: [
        { tSeconds: 0, volts: 560 },
        { tSeconds: 60, volts: 428.5 },
      ],
      rowNumbers: [1, 3],
      issues: [],
    });
  });

  it('when a voltage is mistyped, then the row is named and left out', () => {
    const read = readReadingRows(rows(['0', '560'], ['60', '5x0']));
    expect(read.rowNumbers).toEqual([1]);
    expect(read.issues).toEqual([{ row: 2, field: 'volts', message: 'Row 2: the voltage "5x0" is not a number.' }]);
  });

  it('when a row is half filled, then it says which cell is missing', () => {
    expect(readReadingRows(rows(['0', '560'], ['60', ''])).issues).toEqual([
      { row: 2, field: 'volts', message: 'Row 2: enter the voltage too.' },
    ]);
  });

  it('when a time does not come after the one before, then the engine’s message names the row and the rest is still read', () => {
    const read = readReadingRows(rows(['0', '560'], ['60', '430'], ['30', '300'], ['120', '330']));
    expect(read.rowNumbers).toEqual([1, 2, 4]);
    expect(read.issues).toHaveLength(1);
    expect(read.issues[0]).toMatchObject({ row: 3, field: 'time' });
    expect(read.issues[0]!.message).toMatch(/^Row 3: the time 30 s does not come after/);
  });

  it('when a voltage is zero or below, then the row is named', () => {
    const read = readReadingRows(rows(['0', '560'], ['60', '-3']));
    expect(read.issues).toEqual([expect.objectContaining({ row: 2, field: 'volts', message: expect.stringMatching(/^Row 2: the voltage -3 V is not above zero/) })]);
  });
});

describe('readConditions', () => {
  it('when all is blank, then no conditions (the engine’s 10 MΩ meter)', () => {
    expect(readConditions({ bankTempC: '', meterInputMegohms: '', measuredBleederKilohms: '' })).toEqual({ conditions: {}, issues: [] });
  });

  it('when filled in, then °C, ohms from MΩ and kΩ; a meter of 0 is no loading', () => {
    expect(readConditions({ bankTempC: '31,5', meterInputMegohms: '0', measuredBleederKilohms: '47' })).toEqual({
      conditions: { bankTempC: 31.5, meterInputOhms: null, measuredBleederOhms: 47_000 },
      issues: [],
    });
    expect(readConditions({ bankTempC: '', meterInputMegohms: '11', measuredBleederKilohms: '' }).conditions).toEqual({ meterInputOhms: 11e6 });
  });

  it('when a field is bad, then it is named and left out', () => {
    const read = readConditions({ bankTempC: 'warm', meterInputMegohms: '-1', measuredBleederKilohms: '0' });
    expect(read.conditions).toEqual({});
    expect(read.issues.map((i) => i.field)).toEqual(['bankTempC', 'meterInputMegohms', 'measuredBleederKilohms']);
  });
});

describe('readPastedReadings', () => {
  it('when two columns are pasted from a sheet, then one row per line', () => {
    expect(readPastedReadings('0\t560\n60\t428,5\n\n')).toEqual({
      rows: [
        { time: '0', volts: '560' },
        { time: '60', volts: '428,5' },
      ],
    });
  });

  it('when lines are spaced or comma separated, then the first two cells', () => {
    expect(readPastedReadings('0 560\n60 428.5')).toEqual({ rows: rows(['0', '560'], ['60', '428.5']) });
    expect(readPastedReadings('0,560\n60,428.5')).toEqual({ rows: rows(['0', '560'], ['60', '428.5']) });
  });

  it('when a logger’s CSV with a header is pasted, then its units are converted', () => {
    expect(readPastedReadings('Time (min);Voltage [V]\n0;560,0\n1;428,5\n')).toEqual({ rows: rows(['0', '560'], ['60', '428.5']) });
  });

  it('when the header names no time or voltage column, then a message says so', () => {
    const read = readPastedReadings('when,what\n0,560');
    expect(read).toEqual({ problem: expect.stringMatching(/time column/) });
  });
});

describe('withCell and withoutRow: editing the readings table', () => {
  it('when a cell of the last row is typed into, then an empty row opens below it', () => {
    expect(withCell(rows(['0', '560']), 0, 'volts', '561')).toEqual(rows(['0', '561'], ['', '']));
  });

  it('when a cell of an earlier row changes, or the last is only blanked, then no row is added', () => {
    expect(withCell(rows(['0', '560'], ['', '']), 0, 'time', '1')).toEqual(rows(['1', '560'], ['', '']));
    expect(withCell(rows(['0', '560']), 0, 'time', ' ')).toEqual(rows([' ', '560']));
  });

  it('when a row is removed, then the others stay; removing the only row leaves one empty row', () => {
    expect(withoutRow(rows(['0', '560'], ['30', '490']), 0)).toEqual(rows(['30', '490']));
    expect(withoutRow(rows(['0', '560']), 0)).toEqual(rows(['', '']));
  });
});
