import type { BankEngineInputs } from '../../shared/domain/bank-engine-inputs';

/** The construction and cabinet of an invented electrolytic bank. */
export interface TestBankFigures {
  unitCapacitanceMicrofarads: number;
  seriesCount: number;
  parallelCount: number;
  bleederOhms: number;
  busVolts: number;
}

/**
 * An electrolytic bank's engine inputs: the usual limits (watch 0.9, end of life 0.8), a
 * nameplate baseline of p × C / s (DOMAIN.md) and a cabinet with a 15 min (900 s) marked wait.
 */
export function electrolyticBank(figures: TestBankFigures): BankEngineInputs {
  const { unitCapacitanceMicrofarads, seriesCount, parallelCount, bleederOhms, busVolts } = figures;
  return {
    design: {
      technology: 'electrolytic',
      bleederOhms,
      construction: { unitCapacitanceMicrofarads, seriesCount, parallelCount },
      limits: { watchRatio: 0.9, endOfLifeRatio: 0.8 },
    },
    baseline: { capacitanceMicrofarads: (unitCapacitanceMicrofarads * parallelCount) / seriesCount, source: 'nameplate' },
    cabinet: { nominalBusVolts: busVolts, markedWaitSeconds: 900 },
  };
}

/**
 * The worked bank: 2 × 4700 µF in series = 2350 µF nameplate, a 94 kΩ bleeder, a 560 V bus,
 * a 15 min (900 s) marked wait.
 */
export const WORKED_BANK: BankEngineInputs = electrolyticBank({
  unitCapacitanceMicrofarads: 4700,
  seriesCount: 2,
  parallelCount: 1,
  bleederOhms: 94_000,
  busVolts: 560,
});

/**
 * τ of the healthy worked bank read with the default 10 MΩ meter (DOMAIN.md: R_eff = bleeder ∥
 * meter): 94 kΩ ∥ 10 MΩ = 93,125 Ω; 2350 µF × 93,125 Ω ≈ 218.8 s.
 */
export const WORKED_BANK_HEALTHY_TAU_SECONDS = 2350e-6 * ((94_000 * 10e6) / (94_000 + 10e6));
