import { describe, expect, it } from 'vitest';
import {
  loggerHeaderName,
  matchLoggerColumns,
  type LoggerColumns,
  type LoggerHeaderProblem,
} from '../../../shared/domain/logger-columns';

function columns(cells: string[], options = {}): LoggerColumns {
  const match = matchLoggerColumns(cells, options);
  if (match === null || 'path' in match)
    throw new Error(`expected columns, got ${JSON.stringify(match)}`);
  return match;
}

function problem(cells: string[], options = {}): LoggerHeaderProblem {
  const match = matchLoggerColumns(cells, options);
  if (match === null || !('path' in match))
    throw new Error(`expected a problem, got ${JSON.stringify(match)}`);
  return match;
}

const chosen = (cells: string[], options = {}): [string, string] => {
  const found = columns(cells, options);
  return [cells[found.time.index]!, cells[found.voltage.index]!];
};

describe('loggerHeaderName', () => {
  it('when a unit follows an underscore, then it is split off', () => {
    expect(loggerHeaderName('time_s')).toEqual({ original: 'time_s', name: 'time', unit: 's' });
    expect(loggerHeaderName('u_V')).toEqual({ original: 'u_V', name: 'u', unit: 'v' });
    expect(loggerHeaderName('t_ms')).toEqual({ original: 't_ms', name: 't', unit: 'ms' });
  });

  it('when a name only looks like one with a unit, then it stays whole', () => {
    expect(loggerHeaderName('Date/Time').name).toBe('date/time');
    expect(loggerHeaderName('V DC')).toEqual({ original: 'V DC', name: 'v dc', unit: '' });
    expect(loggerHeaderName('dc bus voltage').name).toBe('dc bus voltage');
  });

  it('when a column is named only ms, then it is a time in milliseconds', () => {
    expect(loggerHeaderName('ms')).toEqual({ original: 'ms', name: 'time', unit: 'ms' });
  });
});

describe('matchLoggerColumns: names loggers write', () => {
  const shapes: [string[], [string, string]][] = [
    [
      ['t_s', 'v'],
      ['t_s', 'v'],
    ],
    [
      ['time_s', 'u_V'],
      ['time_s', 'u_V'],
    ],
    [
      ['Time (s)', 'CH1 (V)'],
      ['Time (s)', 'CH1 (V)'],
    ],
    [
      ['Zeit (s)', 'Spannung (V)', 'Temperatur (°C)'],
      ['Zeit (s)', 'Spannung (V)'],
    ],
    [
      ['Temps (s)', 'Tension (V)'],
      ['Temps (s)', 'Tension (V)'],
    ],
    [
      ['U', 'Time'],
      ['Time', 'U'],
    ],
    [
      ['Timestamp', 'DC bus voltage [V]', 'Current (A)'],
      ['Timestamp', 'DC bus voltage [V]'],
    ],
    [
      ['Date/Time', 'Kanal 1 (V)'],
      ['Date/Time', 'Kanal 1 (V)'],
    ],
    [
      ['Sample', 'Elapsed (ms)', 'CH1'],
      ['Elapsed (ms)', 'CH1'],
    ],
    [
      ['X [s]', 'CH1 [mV]'],
      ['X [s]', 'CH1 [mV]'],
    ],
  ];
  for (const [cells, wanted] of shapes) {
    it(`when the header is ${cells.join(' | ')}, then ${wanted.join(' and ')} are read`, () => {
      expect(chosen(cells)).toEqual(wanted);
    });
  }

  it('when a named voltage stands beside a channel with volts, then the named one is read and the other noted', () => {
    const found = columns(['t', 'v', 'CH2 (V)']);
    expect(found.voltage.index).toBe(1);
    expect(found.otherVoltageColumns).toEqual(['CH2 (V)']);
  });

  it('when a column has another unit, then it is never the voltage', () => {
    expect(problem(['Time (s)', 'CH1 (A)', 'Temp (°C)']).path).toBe('voltsColumn');
  });
});

describe('matchLoggerColumns: questions for the person', () => {
  it('when two channels in volts are equal candidates, then the problem names both with their numbers', () => {
    expect(problem(['Time (s)', 'CH1 (V)', 'CH2 (V)'])).toEqual({
      path: 'voltsColumn',
      strength: 3,
      message:
        '2 columns could be the voltage: "CH1 (V)" (column 2) and "CH2 (V)" (column 3). Choose one by its name or number.',
    });
  });

  it('when two columns could be the time, then the problem asks for the time column', () => {
    expect(problem(['Time (s)', 'Zeit (s)', 'V']).path).toBe('timeColumn');
  });

  it('when the columns are chosen by text (any case) or number, then they are taken', () => {
    expect(chosen(['Time (s)', 'CH1 (V)', 'CH2 (V)'], { voltsColumn: 'ch2 (v)' })).toEqual([
      'Time (s)',
      'CH2 (V)',
    ]);
    expect(chosen(['Time (s)', 'CH1 (V)', 'CH2 (V)'], { voltsColumn: 2 })).toEqual([
      'Time (s)',
      'CH1 (V)',
    ]);
    expect(chosen(['a', 'b', 'c'], { timeColumn: '3', voltsColumn: 'B' })).toEqual(['c', 'b']);
  });

  it('when a chosen column is not there, then the problem lists the columns there are', () => {
    expect(problem(['t_s', 'v'], { voltsColumn: 'CH3 (V)' }).message).toBe(
      'there is no column "CH3 (V)"; the columns are "t_s" (1), "v" (2).',
    );
    expect(problem(['t_s', 'v'], { voltsColumn: 7 }).message).toMatch(
      /^there is no column number 7;/,
    );
  });

  it('when the time and the voltage are chosen as one column, then it is refused', () => {
    expect(problem(['t', 'v'], { timeColumn: 1, voltsColumn: 't' }).message).toMatch(
      /both be read from column 1/,
    );
  });

  it('when a row names neither, then it is no header at all', () => {
    expect(matchLoggerColumns(['Instrument', 'DL-850'])).toBeNull();
    expect(matchLoggerColumns(['0,0', '565,2'])).toBeNull();
  });
});
