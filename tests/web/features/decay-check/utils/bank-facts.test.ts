import { describe, expect, it } from 'vitest';
import { bankDecayFacts } from '../../../../../web/src/features/decay-check/utils/bank-facts';
import { bankJson } from '../bank-json';

describe('bankDecayFacts', () => {
  it('when the bank has a design revision, then technology, bleeder, construction and limits come from it', () => {
    expect(bankDecayFacts(bankJson())?.design).toEqual({
      technology: 'electrolytic',
      bleederOhms: 44_000,
      construction: { unitCapacitanceMicrofarads: 4700, seriesCount: 2, parallelCount: 3 },
      limits: { watchRatio: 0.9, endOfLifeRatio: 0.8 },
      capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.0025 },
    });
  });

  it('when the temperature coefficient is zero, then no temperature model is handed over', () => {
    const bank = bankJson({ designFigures: { ...bankJson().designFigures!, tempCoefficientPercentPerKelvin: 0 } });
    expect(bankDecayFacts(bank)?.design.capacitanceTemperature).toBeUndefined();
  });

  it('when the baseline is the nameplate, then only its capacitance goes over, so τ is expected under the check’s own meter', () => {
    expect(bankDecayFacts(bankJson())?.baseline).toEqual({ capacitanceMicrofarads: 7050, source: 'nameplate' });
  });

  it('when the baseline was entered by hand, then it counts as a measured baseline', () => {
    const bank = bankJson({ baseline: { ...bankJson().baseline, source: 'manual', capacitanceMicrofarads: 6900 } });
    expect(bankDecayFacts(bank)?.baseline).toEqual({ capacitanceMicrofarads: 6900, source: 'decay-run' });
  });

  it('when the cabinet has a bus voltage and a marked wait, then the wait goes over in seconds', () => {
    expect(bankDecayFacts(bankJson())?.cabinet).toEqual({ nominalBusVolts: 540, markedWaitSeconds: 600 });
  });

  it('when the cabinet has neither, or a wait of 0 min, then both are left out', () => {
    expect(bankDecayFacts(bankJson({ cabinetDcBusVolts: null, cabinetMarkedWaitMinutes: 0 }))?.cabinet).toEqual({});
  });

  it('when the design has no revision, then there is nothing to judge with', () => {
    expect(bankDecayFacts(bankJson({ designFigures: null }))).toBeNull();
  });
});
