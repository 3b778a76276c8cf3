import { describe, expect, it } from 'vitest';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { newestFirst } from '../../../../../../web/src/features/decay-runs/components/verdict/bank-run-history';
import { mayCorrectRun } from '../../../../../../web/src/features/decay-runs/components/verdict/run-detail';
import { verdictLook } from '../../../../../../web/src/features/decay-runs/components/verdict/run-verdict';

const recorder = { id: 'u-dario', name: 'Dario Venn' };

/** A run with only what these rules read; the rest is not looked at. */
function run(fields: Partial<DecayRun>): DecayRun {
  return {
    id: 'r1',
    version: 1,
    isolatedAt: '2027-01-09T06:00:00.000Z',
    supersededById: null,
    recordedBy: recorder,
    ...fields,
  } as DecayRun;
}

describe('mayCorrectRun', () => {
  it('when the recorder reads the current version, then they may correct it', () => {
    expect(mayCorrectRun(run({}), { id: 'u-dario', roles: ['technician'] })).toBe(true);
  });

  it('when another technician reads it, then they may not', () => {
    expect(mayCorrectRun(run({}), { id: 'u-lucia', roles: ['technician'] })).toBe(false);
  });

  it('when a reliability engineer reads it, then they may correct it', () => {
    expect(mayCorrectRun(run({}), { id: 'u-ines', roles: ['reliability'] })).toBe(true);
  });

  it('when the version has been corrected already, then nobody may correct it again', () => {
    expect(mayCorrectRun(run({ supersededById: 'r2' }), { id: 'u-dario', roles: ['admin'] })).toBe(
      false,
    );
  });

  it('when nobody is known to be reading, then the correction is not offered', () => {
    expect(mayCorrectRun(run({}), undefined)).toBe(false);
  });
});

describe('newestFirst', () => {
  it('when runs come in any order, then the latest isolation comes first and a correction before the version it corrects', () => {
    const older = run({ id: 'old', isolatedAt: '2026-01-10T06:00:00.000Z' });
    const first = run({ id: 'v1', supersededById: 'v2' });
    const second = run({ id: 'v2', version: 2 });
    expect(newestFirst([older, first, second]).map((r) => r.id)).toEqual(['v2', 'v1', 'old']);
  });
});

describe('verdictLook', () => {
  it('when the verdict has a health, then it looks like that health', () => {
    expect(verdictLook({ status: 'ok', health: 'watch' })).toBe('watch');
  });

  it('when an ok verdict has no health, then it is not judged', () => {
    expect(verdictLook({ status: 'ok', health: null })).toBe('not-judged');
  });

  it('when the readings are unusable and nothing was seen, then it reads as unusable readings', () => {
    expect(verdictLook({ status: 'unusable', health: null })).toBe('unusable');
  });

  it('when the readings are unusable but a visual finding made it end of life, then it is end of life', () => {
    expect(verdictLook({ status: 'unusable', health: 'end-of-life' })).toBe('end-of-life');
  });
});
