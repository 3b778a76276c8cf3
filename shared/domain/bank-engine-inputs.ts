/**
 * From a bank as the register keeps it (its design's revision, its baseline, its cabinet) to
 * what the decay engine judges a run on it with. The one mapping for both sides: the browser's
 * live check passes the bank as the API returns it, the API passes the same figures read from
 * its records, so a run is judged the same way wherever it is judged.
 */
import type { CapacitorTechnology } from '../constants/health';
import type { BaselineSource } from '../constants/register';
import type { BankDesignFacts, BaselineFacts, CabinetFacts } from './verdict';

/** The figures of a design revision a decay run is judged with. */
export interface DesignRevisionFigures {
  unitCapacitanceMicrofarads: number;
  seriesCount: number;
  parallelCount: number;
  /** Design (nameplate) bleeder across the bus, ohms. */
  bleederOhms: number;
  /** Change of capacitance per kelvin, percent; 0 when the design gives none. */
  tempCoefficientPercentPerKelvin: number;
  /** Health limits: ratios of the baseline capacitance. */
  watchRatio: number;
  endOfLifeRatio: number;
}

/**
 * A bank in the parts a decay run on it is judged with. The API's bank answer has this shape
 * (so the browser passes it whole); the API builds it from its records.
 */
export interface BankRecordForEngine {
  technology: CapacitorTechnology;
  /** The design revision to judge with (the current one); null when the design has none. */
  designFigures: DesignRevisionFigures | null;
  baseline: { capacitanceMicrofarads: number; source: BaselineSource };
  /** The cabinet's nominal DC-bus voltage, volts; null when not known. */
  cabinetDcBusVolts: number | null;
  /** The drive maker's marked wait of the cabinet, minutes; null when not marked. */
  cabinetMarkedWaitMinutes: number | null;
}

/** What the decay engine needs to know about one bank ({@link judgeDecayRun}'s design, baseline and cabinet). */
export interface BankEngineInputs {
  design: BankDesignFacts;
  baseline: BaselineFacts;
  cabinet: CabinetFacts;
}

/**
 * The engine's inputs of a bank: its design revision (technology, bleeder, construction,
 * limits, temperature coefficient), its baseline and its cabinet's bus voltage and marked wait.
 *
 * The baseline is handed over as its capacitance only: the engine then expects
 * τ = C_baseline × (bleeder ∥ meter) under the run's own meter, so the τ and capacitance
 * comparisons agree. (The stored baseline τ is the bus's own, R_bleed × C with no meter, for a
 * nameplate baseline, and the meter behind a hand-entered one is not recorded.) A baseline
 * entered by hand counts as measured. A temperature coefficient of 0 is a design without one,
 * and a bus voltage or marked wait that is missing or not above 0 is left out.
 *
 * @param bank - the bank as the register keeps it (the API's bank answer will do)
 * @returns the inputs, or null when the bank's design has no revision to judge with
 * @example
 * bankEngineInputs(bank)
 * // { design: { technology: 'electrolytic', bleederOhms: 44000, construction: {...}, limits: {...},
 * //             capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.0025 } },
 * //   baseline: { capacitanceMicrofarads: 7050, source: 'nameplate' },
 * //   cabinet: { nominalBusVolts: 540, markedWaitSeconds: 600 } }
 */
export function bankEngineInputs(bank: BankRecordForEngine): BankEngineInputs | null {
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
    design.capacitanceTemperature = {
      kind: 'coefficient',
      perKelvin: figures.tempCoefficientPercentPerKelvin / 100,
    };
  }
  const cabinet: CabinetFacts = {};
  if (bank.cabinetDcBusVolts !== null && bank.cabinetDcBusVolts > 0)
    cabinet.nominalBusVolts = bank.cabinetDcBusVolts;
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
