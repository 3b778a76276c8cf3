import { describe, expect, it } from 'vitest';
import { parseRatioHistoryCsv } from '../../../shared/domain/history-csv';

describe('parseRatioHistoryCsv', () => {
  it('when the file has a date,ratio header, then the points are read', () => {
    expect(parseRatioHistoryCsv('date,ratio\n2020-03-01,1.00\n2021-03-01,0.97\n').history).toEqual([
      { measuredOn: '2020-03-01', ratio: 1 },
      { measuredOn: '2021-03-01', ratio: 0.97 },
    ]);
  });

  it('when there is no header, then the rows are read as date, ratio and optional standard error', () => {
    expect(parseRatioHistoryCsv('2020-03-01;1,0\n2021-03-01;0,97;0,01\n').history).toEqual([
      { measuredOn: '2020-03-01', ratio: 1 },
      { measuredOn: '2021-03-01', ratio: 0.97, ratioStdError: 0.01 },
    ]);
  });

  it('when the header uses other names (measured on, c/c0, sigma), then they match', () => {
    const csv = parseRatioHistoryCsv('Measured on\tC/C0\tsigma\n2020-03-01\t0.99\t0.004\n');
    expect(csv.history).toEqual([{ measuredOn: '2020-03-01', ratio: 0.99, ratioStdError: 0.004 }]);
  });

  it('when a date carries a time, then the date part is kept', () => {
    expect(
      parseRatioHistoryCsv('date,ratio\n2020-03-01T10:15:00Z,0.99\n').history[0]!.measuredOn,
    ).toBe('2020-03-01');
  });

  it('when a date is not a calendar date, then the message names its row', () => {
    expect(() => parseRatioHistoryCsv('date,ratio\n2021-03-01,1.00\n2022-02-30,0.97\n')).toThrow(
      /Row 3, column date: "2022-02-30" is not a calendar date/,
    );
  });

  it('when a ratio is not a number, then the message names its row', () => {
    expect(() => parseRatioHistoryCsv('date,ratio\n2021-03-01,ok\n')).toThrow(
      /Row 2, column ratio/,
    );
  });

  it('when the file has no dates and no header, then it is refused', () => {
    expect(() => parseRatioHistoryCsv('a,b\n1,2\n')).toThrow(/No header row found/);
  });
});
