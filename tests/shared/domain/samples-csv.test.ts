import { describe, expect, it } from 'vitest';
import { parseDecaySamplesCsv } from '../../../shared/domain/samples-csv';
import { EngineInputError } from '../../../shared/domain/errors';

function errorOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
  throw new Error('expected an EngineInputError');
}

describe('parseDecaySamplesCsv: layouts', () => {
  it('when the file is comma separated with short names, then the samples are read', () => {
    const csv = parseDecaySamplesCsv('t,v\n0,560\n30,490.5\n');
    expect(csv.samples).toEqual([
      { tSeconds: 0, volts: 560 },
      { tSeconds: 30, volts: 490.5 },
    ]);
    expect(csv.separator).toBe(',');
    expect(csv.rowNumbers).toEqual([2, 3]);
  });

  it('when the file is semicolon separated with decimal commas and units, then the numbers are read', () => {
    const csv = parseDecaySamplesCsv('Time (s);Voltage [V]\n0;560,0\n12,5;428,25\n');
    expect(csv.samples).toEqual([
      { tSeconds: 0, volts: 560 },
      { tSeconds: 12.5, volts: 428.25 },
    ]);
    expect(csv.decimalComma).toBe(true);
    expect([csv.timeColumn, csv.voltageColumn]).toEqual(['Time (s)', 'Voltage [V]']);
  });

  it('when the file is tab separated with milliseconds and millivolts, then they are converted to seconds and volts', () => {
    const csv = parseDecaySamplesCsv('t [ms]\tU [mV]\n0\t560000\n1500\t490000\n');
    expect(csv.samples).toEqual([
      { tSeconds: 0, volts: 560 },
      { tSeconds: 1.5, volts: 490 },
    ]);
  });

  it('when times are in minutes, then they are converted', () => {
    expect(parseDecaySamplesCsv('time/min,volts\n0,560\n2,300\n').samples[1]).toEqual({
      tSeconds: 120,
      volts: 300,
    });
  });

  it('when the header uses other loose names (seconds, volt, s, voltage), then they match', () => {
    expect(parseDecaySamplesCsv('seconds,volt\n0,5\n1,4\n').samples).toHaveLength(2);
    expect(parseDecaySamplesCsv('s;voltage\n0;5\n1;4\n').samples).toHaveLength(2);
  });

  it('when there are blank lines, trailing spaces, Windows line ends and a byte-order mark, then they are ignored', () => {
    const csv = parseDecaySamplesCsv('\uFEFFt,v  \r\n\r\n0,560  \r\n   \r\n30,490\r\n\r\n');
    expect(csv.samples).toEqual([
      { tSeconds: 0, volts: 560 },
      { tSeconds: 30, volts: 490 },
    ]);
    expect(csv.rowNumbers).toEqual([3, 5]);
  });

  it('when a logger writes a preamble and extra columns, then the header is found and the extra columns are ignored', () => {
    const csv = parseDecaySamplesCsv(
      'Logger export\nSample rate 5 Hz\n\nTime (s);DC bus voltage [V];Temp (°C)\n0,0;565,2;24,1\n0,2;563,9;24,1\n',
    );
    expect(csv.samples).toEqual([
      { tSeconds: 0, volts: 565.2 },
      { tSeconds: 0.2, volts: 563.9 },
    ]);
    expect(csv.rowNumbers).toEqual([5, 6]);
  });

  it('when cells are quoted, then the quotes are removed', () => {
    expect(parseDecaySamplesCsv('"t","v"\n"0","560"\n"30","490"\n').samples[1]).toEqual({
      tSeconds: 30,
      volts: 490,
    });
  });

  it('when the voltage column comes first, then the columns are still matched by name', () => {
    expect(parseDecaySamplesCsv('volts,time\n560,0\n490,30\n').samples[1]).toEqual({
      tSeconds: 30,
      volts: 490,
    });
  });
});

describe('parseDecaySamplesCsv: bad files', () => {
  it('when a cell is not a number, then the message names its row and column', () => {
    const error = errorOf(() => parseDecaySamplesCsv('time;volts\n0;560\n30;49O\n'));
    expect(error.code).toBe('invalid-csv');
    expect(error.message).toBe('Row 3, column "volts": "49O" is not a number.');
  });

  it('when a cell is empty, then the message names its row and column', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560\n30,\n')).toThrow(
      /Row 3, column "v": the cell is empty/,
    );
  });

  it('when a comma-separated file has a decimal comma, then the row is refused rather than misread', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560,5\n')).toThrow(
      'Row 2, column 3: "5" stands beyond the header\'s 2 columns (the row has 3 cells). Decimal commas need a semicolon-separated file.',
    );
  });

  it('when there is no header, then the message says the first row already holds readings', () => {
    expect(() => parseDecaySamplesCsv('0,560\n30,490\n')).toThrow(
      'No header row found: row 1 ("0,560") already holds readings. Add a header row naming the time and voltage columns, such as "t_s,v" or "Time (s);Voltage (V)".',
    );
  });

  it('when the file is empty, then it says so', () => {
    expect(() => parseDecaySamplesCsv('\n\n')).toThrow(/empty/);
  });

  it('when a unit is unknown, then it is refused with the accepted units', () => {
    expect(() => parseDecaySamplesCsv('t (fortnights),v\n0,1\n')).toThrow(
      /unknown time unit "fortnights"/,
    );
  });

  it('when a voltage drops from high straight to below zero, then the message names the row, the column and the reading before', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560\n30,490\n60,-3\n')).toThrow(
      'Row 4: the voltage -3 V is not above zero (column "v"), right after 490 V at row 3: a decay does not drop to 0 V in one step. Check the sign, the probe\'s connection or a typing slip.',
    );
  });

  it('when a voltage below zero is followed by real voltages, then it is refused, not left out', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560\n30,490\n60,-3\n90,380\n')).toThrow(
      /^Row 4: the voltage -3 V is not above zero \(column "v"\), yet row 5 reads 380 V after it/,
    );
  });

  it('when a repeated time has readings that disagree, then the message names the rows and both columns', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560\n\n30,490\n30,430\n')).toThrow(
      'Row 5: the time 30 s does not come after row 4\'s 30 s (column "t"), and the rows of this time read 430 V to 490 V (column "v"): a repeated time is averaged only when its readings agree within 2 %. Check for a typing slip.',
    );
  });

  it('when times go backwards, then the message names the row and the column', () => {
    expect(() => parseDecaySamplesCsv('t,v\n0,560\n30,490\n20,470\n')).toThrow(
      'Row 4: the time 20 s does not come after row 3\'s 30 s (column "t"); times must increase.',
    );
  });

  it('when validation is switched off, then the raw numbers are returned', () => {
    expect(parseDecaySamplesCsv('t,v\n0,-1\n', { validate: false }).samples).toEqual([
      { tSeconds: 0, volts: -1 },
    ]);
  });
});

describe('parseDecaySamplesCsv: logger layouts', () => {
  it('when a footer follows the readings, then it is skipped with a note', () => {
    const csv = parseDecaySamplesCsv('t_s,v\n0,560\n30,490\n60,430\nEnd of data,\nSamples,3\n');
    expect(csv.samples).toHaveLength(3);
    expect(csv.notes).toContain(
      'Rows 5 to 6 after the readings hold no times (a footer) and were not read.',
    );
  });

  it('when a text cell stands between readings, then it is refused with its row and column', () => {
    expect(() => parseDecaySamplesCsv('t_s,v\n0,560\n30,490\nEnd of data,\n60,430\n')).toThrow(
      'Row 4, column "t_s": "End of data" is not a number.',
    );
  });

  it('when clock times pass midnight, then the times go on counting', () => {
    const csv = parseDecaySamplesCsv('Time;U\n23:59:59,0;560\n00:00:29,0;490\n00:00:59,0;430\n');
    expect(csv.samples.map((s) => s.tSeconds)).toEqual([0, 30, 60]);
    expect(csv.timeFormat).toBe('clock');
  });

  it('when a timestamp column holds bare numbers, then it is refused rather than guessed as seconds', () => {
    expect(() =>
      parseDecaySamplesCsv('Timestamp,V\n1718093730250,560\n1718093760250,490\n'),
    ).toThrow(
      'Row 2, column "Timestamp": the column\'s name calls for dates and times, but it holds the number "1718093730250"; give its unit in the header (for example "Timestamp (ms)") or choose another time column.',
    );
    expect(
      parseDecaySamplesCsv(
        'Timestamp (ms),V\n1718093730250,560\n1718093760250,490\n1718093790250,430\n',
      ).samples[1]!.tSeconds,
    ).toBe(1718093760.25);
  });

  it('when the readings sit under a row with names it does not know, then the refusal quotes both rows', () => {
    expect(() => parseDecaySamplesCsv('Logger 7\nKanal A;Kanal B\n0;560\n30;490\n')).toThrow(
      'No header row found: the readings start at row 3 ("0;560"), and row 2 above them ("Kanal A;Kanal B") names neither a time column nor a voltage column. Rename the columns, such as "t_s,v" or "Time (s);Voltage (V)", or choose them by number.',
    );
  });

  it('when no line holds numbers, then the refusal says so and quotes the start', () => {
    expect(() => parseDecaySamplesCsv('<html>\n<body>Sign in</body>\n</html>\n')).toThrow(
      'No readings found: none of the first 4 lines holds a row of numbers (the file starts "<html>"). Is it a logger\'s CSV export?',
    );
  });

  it('when the header comes after 99 lines of preamble, then it is found; after 100, it is not', () => {
    const preamble = (count: number): string =>
      Array.from({ length: count }, (_, i) => `Setting ${i};on`).join('\n');
    expect(parseDecaySamplesCsv(`${preamble(99)}\nt_s;v\n0;560\n30;490\n60;430\n`).headerRow).toBe(
      100,
    );
    expect(() => parseDecaySamplesCsv(`${preamble(100)}\nt_s;v\n0;560\n30;490\n60;430\n`)).toThrow(
      'No header row found in the first 100 lines: the readings start at row 102, under row 101 ("t_s;v"). Shorten the preamble so that the header is within the first 100 lines.',
    );
  });

  it('when validation is off, then pre-trigger readings and the tail stay as written', () => {
    const text =
      't,v\n0,560\n1,560\n2,560\n3,560\n4,560\n5,560\n6,500\n7,440\n8,380\n9,0.1\n10,-0.05\n';
    expect(parseDecaySamplesCsv(text, { validate: false }).samples).toHaveLength(11);
  });
});

describe('parseDecaySamplesCsv: header variants', () => {
  it('when a units row stands under the names, then its units are applied and the readings start after it', () => {
    const csv = parseDecaySamplesCsv('Time;CH1\nms;mV\n0;560000\n30000;490000\n60000;430000\n');
    expect(csv.samples[1]).toEqual({ tSeconds: 30, volts: 490 });
    expect(csv.rowNumbers[0]).toBe(3);
    expect(parseDecaySamplesCsv('t,U\n[s],[V]\n0,560\n30,490\n60,430\n').samples).toHaveLength(3);
  });

  it('when the columns are separated by spaces, then the refusal says so', () => {
    expect(() => parseDecaySamplesCsv('t v\n0 560\n30 490\n')).toThrow(
      'Row 2 ("0 560"): the columns are separated by spaces; the file must be comma, semicolon or tab separated. Export it as CSV, or replace the spaces between columns with semicolons.',
    );
  });
});

describe('parseDecaySamplesCsv: first rows that are not readings', () => {
  it('when the first time cell is text but its voltage is a number, then it is refused, not taken for a footer', () => {
    expect(() => parseDecaySamplesCsv('Zeit;Spannung\nabc;560\n')).toThrow(
      'Row 2, column "Zeit": "abc" is not a time: a number of seconds, a clock time such as 08:15:30.25 or a date and time such as 2024-06-11 08:15:30.',
    );
  });
});
