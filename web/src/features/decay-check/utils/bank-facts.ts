import type { BankDesignFacts, BaselineFacts, CabinetFacts } from '../../../../../shared/domain';
import type { Bank } from '../../../../../shared/schemas/bank';

/** What the decay engine needs to know about one bank, from the bank as the API returns it. */
export interface BankDecayFacts {
  design: BankDesignFacts;
  baseline: BaselineFacts;
  cabinet: CabinetFacts;
}

/**
 * The engine's facts of a bank: its design's current revision (technology, bleeder, construction,
 * limits, temperature coefficient), its baseline and its cabinet's bus voltage and marked wait.
 *
 * The baseline is handed over as its capacitance only: the engine then expects
 * τ = C_baseline × (bleeder ∥ meter) under the check's own meter, so the τ and capacitance
 * comparisons agree. The stored baseline τ is the bus's own (R_bleed × C, no meter) for a
 * nameplate baseline, and the meter behind a hand-entered one is not recorded.
 *
 * @param bank - the bank as GET /api/banks/:bankId returns it
 * @returns the facts, or null when the bank's design has no revision to judge with
 * @example
 * bankDecayFacts(bank)
 * // { design: { technology: 'electrolytic', bleederOhms: 44000, construction: {...}, limits: {...} },
 * //   baseline: { capacitanceMicrofarads: 7050, source: 'nameplate' },
 * //   cabinet: { nominalBusVolts: 540, markedWaitSeconds: 600 } }
 */
export function bankDecayFacts(bank: Bank): BankDecayFacts | null {
  const figures = bank.designFigures;
  if (!figures) return null;
  const design: BankDesignFacts = {
    technology: bank.technology,
    bleederOhms: figures.bleederOhms,
    construction: {
      unitCapacitanceMicrofarads: figures.unitCapacitanceMicrofarads,
      seriesCount: figures.seriesCount,
      parallelCount: figures.parallelCount,
    },
    limits: { watchRatio: figures.watchRatio, endOfLifeRatio: figures.endOfLifeRatio },
  };
  // a coefficient of zero is a design without one: nothing to normalise with
  if (figures.tempCoefficientPercentPerKelvin !== 0) {
    design.capacitanceTemperature = { kind: 'coefficient', perKelvin: figures.tempCoefficientPercentPerKelvin / 100 };
  }
  const cabinet: CabinetFacts = {};
  if (bank.cabinetDcBusVolts !== null && bank.cabinetDcBusVolts > 0) cabinet.nominalBusVolts = bank.cabinetDcBusVolts;
  // a marked wait of 0 min means none is marked
  if (bank.cabinetMarkedWaitMinutes !== null && bank.cabinetMarkedWaitMinutes > 0) {
    cabinet.markedWaitSeconds = bank.cabinetMarkedWaitMinutes * 60;
  }
  return {
    design,
    baseline: {
      capacitanceMicrofarads: bank.baseline.capacitanceMicrofarads,
      source: bank.baseline.source === 'nameplate' ? 'nameplate' : 'decay-run',
    },
    cabinet,
  };
}
