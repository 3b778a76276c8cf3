import { describe, expect, it } from 'vitest';
import { bankEngineInputs } from '../../../../../shared/domain';
import type { VisitBankRef } from '../../../../../shared/schemas/visit';
import {
  captureSnapshotOf,
  clockText,
  expectedTauOf,
  FALLBACK_TAU_SECONDS,
  waitText,
} from '../../../../../web/src/features/decay-runs/components/capture/capture-facts';
import { bankJson } from '../bank-json';

const bank = (over: Partial<VisitBankRef & { lastTauSeconds: number | null }>): VisitBankRef =>
  ({
    id: 'b1',
    position: 'Drive 1',
    bankDesignCode: 'EL',
    baselineTauSeconds: 300,
    lastTauSeconds: null,
    runCount: 0,
    ...over,
  }) as VisitBankRef;

describe('expectedTauOf', () => {
  it('when the bank has an accepted run, then its τ is expected', () => {
    expect(expectedTauOf(bank({ lastTauSeconds: 280 }))).toEqual({
      tauSeconds: 280,
      source: 'last run',
    });
  });

  it('when it has none, then the baseline τ is expected', () => {
    expect(expectedTauOf(bank({}))).toEqual({ tauSeconds: 300, source: 'baseline' });
  });

  it('when neither is a positive number, then a typical τ is assumed', () => {
    expect(expectedTauOf(bank({ baselineTauSeconds: 0 }))).toEqual({
      tauSeconds: FALLBACK_TAU_SECONDS,
      source: 'assumed',
    });
  });
});

describe('clockText', () => {
  it.each([
    [0, '0:00'],
    [5.9, '0:05'],
    [75, '1:15'],
    [3600 + 62, '1:01:02'],
    [-3, '0:00'],
  ])('when %s s have passed, then the clock shows %s', (seconds, text) => {
    expect(clockText(seconds)).toBe(text);
  });
});

describe('waitText', () => {
  it.each([
    [45, '45 s'],
    [181, '4 min'],
    [2 * 3600 + 20 * 60, '2 h 20 min'],
  ])('when the wait is %s s, then it reads %s', (seconds, text) => {
    expect(waitText(seconds)).toBe(text);
  });
});

describe('captureSnapshotOf', () => {
  const visit = { cabinetTag: 'BRK-T1-VFD-001', cabinetMarkedWaitMinutes: 10 };

  it('when a run starts, then it keeps the cabinet, the bank, the marked wait, the expected τ and the engine inputs', () => {
    const engine = bankEngineInputs(bankJson());
    expect(engine).not.toBeNull();
    const snapshot = captureSnapshotOf(visit, bank({ lastTauSeconds: 280 }), engine);
    expect(snapshot).toEqual({
      cabinetTag: 'BRK-T1-VFD-001',
      bankPosition: 'Drive 1',
      markedWaitMinutes: 10,
      expectedTauSeconds: 280,
      engine,
    });
    // kept in IndexedDB: plain data only
    expect(structuredClone(snapshot)).toEqual(snapshot);
  });

  it('when the bank’s figures are not at hand and no wait is marked, then both are kept as null and τ is the expected one', () => {
    expect(captureSnapshotOf({ ...visit, cabinetMarkedWaitMinutes: null }, bank({ baselineTauSeconds: 0 }), null)).toEqual({
      cabinetTag: 'BRK-T1-VFD-001',
      bankPosition: 'Drive 1',
      markedWaitMinutes: null,
      expectedTauSeconds: FALLBACK_TAU_SECONDS,
      engine: null,
    });
  });
});
