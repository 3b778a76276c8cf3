import { describe, expect, it } from 'vitest';
import { EngineInputError } from '../../../shared/domain/errors';
import { LoggerColumnsQuestion, parseDecaySamplesCsv } from '../../../shared/domain/samples-csv';

function questionOf(input: string, options: Parameters<typeof parseDecaySamplesCsv>[1] = {}): LoggerColumnsQuestion {
  try {
    parseDecaySamplesCsv(input, options);
  } catch (error) {
    if (error instanceof LoggerColumnsQuestion) return error;
    throw error;
  }
  throw new Error('expected a column question');
}

describe('the column question of a logger file', () => {
  it('when two columns could be the voltage, then the refusal carries the header and the first rows under it', () => {
    const text = 'Logger DL-7\n\nTime (s);CH1 (V);CH2 (V)\n0,0;565,0;12,0\n\n0,5;563,7;12,1\n1,0;562,5;12,0\n1,5;561,0;12,0\n2,0;560,1;12,0\n2,5;559,0;12,0\n';
    const question = questionOf(text);
    expect(question).toBeInstanceOf(EngineInputError);
    expect(question.code).toBe('invalid-csv');
    expect(question.path).toBe('voltsColumn');
    expect(question.headerRow).toBe(3);
    expect(question.columns).toEqual(['Time (s)', 'CH1 (V)', 'CH2 (V)']);
    // five rows, the blank line skipped
    expect(question.rows).toEqual([
      ['0,0', '565,0', '12,0'],
      ['0,5', '563,7', '12,1'],
      ['1,0', '562,5', '12,0'],
      ['1,5', '561,0', '12,0'],
      ['2,0', '560,1', '12,0'],
    ]);
    expect(question.message).toMatch(/^Row 3 \(the header, semicolon separated\): 2 columns could be the voltage/);
    expect(question.issues).toEqual([{ path: 'voltsColumn', message: question.message }]);
  });

  it('when the voltage column is not found by its name, then the question asks for the voltage column', () => {
    const question = questionOf('Time (s),Reading\n0,565\n1,560\n2,555\n');
    expect(question.path).toBe('voltsColumn');
    expect(question.columns).toEqual(['Time (s)', 'Reading']);
    expect(question.rows).toHaveLength(3);
  });

  it('when a chosen column is not there, then the question names the columns there are', () => {
    const question = questionOf('Time (s),CH1 (V),CH2 (V)\n0,565,12\n1,560,12\n2,555,12\n', { voltsColumn: 'CH9' });
    expect(question.message).toMatch(/there is no column "CH9"/);
    expect(question.columns).toEqual(['Time (s)', 'CH1 (V)', 'CH2 (V)']);
  });

  it('when the question is answered by a column choice, then the file is read', () => {
    const read = parseDecaySamplesCsv('Time (s),Reading\n0,565\n1,560\n2,555\n', { voltsColumn: 2 });
    expect(read.samples).toEqual([
      { tSeconds: 0, volts: 565 },
      { tSeconds: 1, volts: 560 },
      { tSeconds: 2, volts: 555 },
    ]);
  });
});
