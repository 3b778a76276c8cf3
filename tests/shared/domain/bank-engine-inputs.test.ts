import { describe, expect, it } from 'vitest';
import {
  bankEngineInputs,
  type BankRecordForEngine,
} from '../../../shared/domain/bank-engine-inputs';

/** A series-pair bank (3 strings of 2 × 4700 µF, 44 kΩ bleeder) on a 540 V bus with a 10 min marked wait. */
function bank(overrides: Partial<BankRecordForEngine> = {}): BankRecordForEngine {
  return {
    technology: 'electrolytic',
    designFigures: {
      unitCapacitanceMicrofarads: 4700,
      seriesCount: 2,
      parallelCount: 3,
      bleederOhms: 44_000,
      tempCoefficientPercentPerKelvin: 0.25,
      watchRatio: 0.9,
      endOfLifeRatio: 0.8,
    },
    baseline: { capacitanceMicrofarads: 7050, source: 'nameplate' },
    cabinetDcBusVolts: 540,
    cabinetMarkedWaitMinutes: 10,
    ...overrides,
  };
}

describe('bankEngineInputs', () => {
  it('when the bank has a design revision, then technology, bleeder, construction and limits come from it', () => {
    expect(bankEngineInputs(bank())?.design).toEqual({
      technology: 'electrolytic',
      bleederOhms: 44_000,
      construction: { unitCapacitanceMicrofarads: 4700, seriesCount: 2, parallelCount: 3 },
      limits: { watchRatio: 0.9, endOfLifeRatio: 0.8 },
      capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.0025 },
    });
  });

  it('when the temperature coefficient is zero, then no temperature model is handed over', () => {
    const zero = bank({
      designFigures: { ...bank().designFigures!, tempCoefficientPercentPerKelvin: 0 },
    });
    expect(bankEngineInputs(zero)?.design.capacitanceTemperature).toBeUndefined();
  });

  it('when the baseline is the nameplate, then only its capacitance goes over, so τ is expected under the run’s own meter', () => {
    expect(bankEngineInputs(bank())?.baseline).toEqual({
      capacitanceMicrofarads: 7050,
      source: 'nameplate',
    });
  });

  it('when the baseline was entered by hand, then it counts as a measured baseline', () => {
    const manual = bank({ baseline: { capacitanceMicrofarads: 6900, source: 'manual' } });
    expect(bankEngineInputs(manual)?.baseline).toEqual({
      capacitanceMicrofarads: 6900,
      source: 'decay-run',
    });
  });

  it('when the baseline came from a decay run, then it stays a measured baseline', () => {
    const measured = bank({ baseline: { capacitanceMicrofarads: 6950, source: 'decay-run' } });
    expect(bankEngineInputs(measured)?.baseline).toEqual({
      capacitanceMicrofarads: 6950,
      source: 'decay-run',
    });
  });

  it('when the cabinet has a bus voltage and a marked wait, then the wait goes over in seconds', () => {
    expect(bankEngineInputs(bank())?.cabinet).toEqual({
      nominalBusVolts: 540,
      markedWaitSeconds: 600,
    });
  });

  it('when the cabinet has neither, or a wait of 0 min, then both are left out', () => {
    expect(
      bankEngineInputs(bank({ cabinetDcBusVolts: null, cabinetMarkedWaitMinutes: 0 }))?.cabinet,
    ).toEqual({});
    expect(
      bankEngineInputs(bank({ cabinetDcBusVolts: 0, cabinetMarkedWaitMinutes: null }))?.cabinet,
    ).toEqual({});
  });

  it('when the design has no revision, then there is nothing to judge with', () => {
    expect(bankEngineInputs(bank({ designFigures: null }))).toBeNull();
  });
});
