/**
 * The verdict of a decay run: from samples and the bank's facts to τ, capacitance, the ratio to
 * the baseline, health, findings in plain words and the discharge safety estimate.
 *
 * Reading τ both ways (DOMAIN.md): τ = R·C, so a falling τ is capacitance loss or a bleeder whose
 * resistance fell; a rising τ is usually the bleeder's resistance rising or a resistor opening,
 * which keeps the bus dangerous for longer: a safety finding. A bleeder measured with the bus
 * discharged separates the two, and when one is given it is used.
 */

import {
  HEALTH_LABELS,
  DEFAULT_TAU_RISE_TOLERANCE,
  type CapacitorTechnology,
  type HealthLimits,
  type HealthName,
} from '../constants/health';
import { EngineInputError, type Unusable } from './errors';
import { fitDecay, type DecayFit, type DecayFitOptions, type DecaySample } from './decay-fit';
import {
  bankCapacitanceMicrofarads,
  capacitanceFromTauMicrofarads,
  effectiveDischargeOhms,
  normaliseCapacitanceTo20C,
  resolveMeterInputOhms,
  type BankConstruction,
  type CapacitanceTemperatureModel,
} from './capacitance';
import {
  classifyHealth,
  isPlausibleRatio,
  PLAUSIBLE_RATIO,
  resolveHealthLimits,
  worseHealth,
} from './health-rules';
import {
  estimateDischargeSafety,
  iec60204Sentence,
  type DischargeSafetyEstimate,
} from './discharge-safety';
import {
  formatNumber,
  formatOhms,
  formatPercent,
  formatPercentFigure,
  formatVolts,
} from './format';
import { assumedMeterWarning } from './meter-loading';

/** The bank design's facts (from the register). */
export interface BankDesignFacts {
  technology: CapacitorTechnology;
  /** Design (nameplate) bleeder resistance across the bus, ohms. */
  bleederOhms: number;
  /** Units and how they are connected, for the nominal capacitance. */
  construction?: BankConstruction;
  /** The design's health limits; the technology's defaults when absent. */
  limits?: HealthLimits;
  /** How capacitance depends on temperature, for normalising to 20 °C. */
  capacitanceTemperature?: CapacitanceTemperatureModel;
  /** Fraction τ may rise above the baseline before it is a safety finding (default 0.1). */
  tauRiseTolerance?: number;
}

/** The bank's baseline: its first trusted decay run, or its nameplate. */
export interface BaselineFacts {
  /** Reference capacitance at 20 °C, microfarads. */
  capacitanceMicrofarads: number;
  /** Reference τ measured under the same conditions (same meter), seconds, when known. */
  tauSeconds?: number;
  source: 'decay-run' | 'nameplate';
}

/** The cabinet's facts. */
export interface CabinetFacts {
  /** Nominal DC bus voltage, volts (e.g. 560 on a 400 V supply). */
  nominalBusVolts?: number;
  /** Wait time marked on the cabinet or in the drive manual, seconds. */
  markedWaitSeconds?: number;
}

/** How this run was taken. */
export interface RunConditions {
  /** Meter input resistance, ohms; default 10 MΩ; null or 0 = no loading. */
  meterInputOhms?: number | null;
  /** Bank temperature during the run, °C. */
  bankTempC?: number;
  /** Bleeder resistance measured with the bus discharged, ohms; used instead of the design's. */
  measuredBleederOhms?: number;
}

/** Everything {@link judgeDecayRun} needs. */
export interface DecayRunFacts {
  samples: readonly DecaySample[];
  design: BankDesignFacts;
  baseline?: BaselineFacts;
  cabinet?: CabinetFacts;
  conditions?: RunConditions;
  /** Fit switches (control-supply and off-curve detection are on by default). */
  fitOptions?: Omit<DecayFitOptions, 'effectiveOhms'>;
}

/** Codes of {@link VerdictFinding}. */
export type VerdictFindingCode =
  | 'tau-rise'
  | 'capacitance-loss'
  | 'bleeder-drift'
  | 'measured-bleeder-used'
  | 'discharge-exceeds-marked-wait'
  | 'discharge-grown'
  | 'iec-60204'
  | 'baseline-from-nameplate'
  | 'no-baseline'
  | 'not-normalised'
  | 'ratio-near-limit'
  | 'implausible-ratio'
  | 'control-supply-phase'
  | 'readings-left-out'
  | 'meter-input-assumed'
  | 'visual-finding';

/** One finding in plain words. `safety` findings must be shown prominently. */
export interface VerdictFinding {
  code: VerdictFindingCode;
  severity: 'info' | 'attention' | 'safety';
  message: string;
}

/** The full verdict of a decay run. All numbers finite. */
export interface DecayVerdict {
  status: 'ok';
  /** The fit (τ with its interval, V0, residuals, readings left out, control-supply phase). */
  fit: DecayFit;
  /** Fitted τ, seconds (the same as fit.tauSeconds). */
  tauSeconds: number;
  resistance: {
    /** Bleeder resistance used, ohms. */
    bleederOhms: number;
    bleederSource: 'measured' | 'design';
    /** Meter input resistance used, ohms; null = no loading. */
    meterInputOhms: number | null;
    /** Bleeder ∥ meter, ohms. */
    effectiveOhms: number;
  };
  capacitance: {
    /** τ / R_eff at the bank's temperature, microfarads. */
    measuredMicrofarads: number;
    /** 95 % interval of the measured capacitance, microfarads. */
    measuredCi95Microfarads: [number, number];
    /** Normalised to 20 °C; null without both a bank temperature and the design's model. */
    at20CMicrofarads: number | null;
    /** The value compared with the baseline (at 20 °C when available), microfarads. */
    comparedMicrofarads: number;
    /** Nominal bank capacitance from the construction, microfarads; null without one. */
    nominalMicrofarads: number | null;
  };
  /** Comparison with the baseline; null when there is neither a baseline nor a construction. */
  baseline: {
    source: 'decay-run' | 'nameplate';
    capacitanceMicrofarads: number;
    /** τ expected from the baseline under this run's conditions, seconds. */
    expectedTauSeconds: number;
    /** Compared capacitance / baseline capacitance. */
    ratio: number;
    /** Standard error of the ratio (from τ's). */
    ratioStdError: number;
    /** 95 % interval of the ratio. */
    ratioCi95: [number, number];
    /** Fitted τ / expected τ. */
    tauRatio: number;
  } | null;
  /** Health; null when not judged (see {@link notJudgedBecause}). */
  health: HealthName | null;
  /** Display label of the health ("end of life"); null when not judged. */
  healthLabel: string | null;
  /**
   * Why health is null: no baseline and no nameplate construction, or a ratio outside what
   * ageing can explain (the bleeder value or the readings are in doubt); null when judged.
   */
  notJudgedBecause: 'no-baseline' | 'implausible-ratio' | null;
  /** The limits applied. */
  limits: HealthLimits;
  /** Findings, safety first. */
  findings: VerdictFinding[];
  /** True when any finding is a safety finding. */
  safetyFinding: boolean;
  /** Discharge safety estimate; show it with its `caution`. */
  discharge: DischargeSafetyEstimate;
  /** The fit's warnings (plain words). */
  warnings: string[];
}

/** {@link judgeDecayRun}'s answer. */
export type DecayVerdictResult = DecayVerdict | Unusable;

/**
 * Judges one decay run on one bank: the fit, capacitance, ratio to baseline, health, findings
 * and the discharge safety estimate.
 *
 * When no baseline is given but the design's construction is, the nameplate capacitance serves
 * as the baseline (said in a finding). Without either, health is null.
 *
 * @param facts - see {@link DecayRunFacts}
 * @returns the verdict, or {@link Unusable} when the run cannot be fitted (reason in plain words)
 * @throws EngineInputError for malformed samples or facts
 * @example
 * judgeDecayRun({
 *   samples,                                   // [{ tSeconds, volts }, ...]
 *   design: { technology: 'electrolytic', bleederOhms: 94_000,
 *             construction: { unitCapacitanceMicrofarads: 4700, seriesCount: 2, parallelCount: 1 } },
 *   baseline: { capacitanceMicrofarads: 2350, source: 'nameplate' },
 *   cabinet: { nominalBusVolts: 560, markedWaitSeconds: 900 },
 *   conditions: { meterInputOhms: 10e6, bankTempC: 25 },
 * }) // { status: 'ok', tauSeconds, capacitance, baseline: { ratio }, health: 'healthy', findings, discharge, ... }
 */
export function judgeDecayRun(facts: DecayRunFacts): DecayVerdictResult {
  const { design } = facts;
  const conditions = facts.conditions ?? {};
  const cabinet = facts.cabinet ?? {};
  const limits = resolveHealthLimits(design.technology, design.limits);
  const tolerance = design.tauRiseTolerance ?? DEFAULT_TAU_RISE_TOLERANCE;
  if (!(tolerance > 0 && tolerance < 1)) {
    throw new EngineInputError(
      'invalid-option',
      `The τ rise tolerance must be a fraction between 0 and 1, got ${String(tolerance)}.`,
      [{ path: 'design.tauRiseTolerance', message: 'fraction between 0 and 1' }],
    );
  }
  const meterInputOhms = resolveMeterInputOhms(conditions.meterInputOhms);
  const designEffectiveOhms = effectiveDischargeOhms(design.bleederOhms, meterInputOhms);
  const measuredBleeder = conditions.measuredBleederOhms;
  if (measuredBleeder !== undefined) effectiveDischargeOhms(measuredBleeder, null); // validates
  const bleederOhms = measuredBleeder ?? design.bleederOhms;
  const effectiveOhms = effectiveDischargeOhms(bleederOhms, meterInputOhms);
  positiveOrAbsent(cabinet.nominalBusVolts, 'cabinet.nominalBusVolts', 'The nominal bus voltage');
  positiveOrAbsent(
    facts.baseline?.capacitanceMicrofarads,
    'baseline.capacitanceMicrofarads',
    'The baseline capacitance',
  );
  positiveOrAbsent(facts.baseline?.tauSeconds, 'baseline.tauSeconds', 'The baseline τ');
  if (conditions.bankTempC !== undefined && !Number.isFinite(conditions.bankTempC)) {
    throw new EngineInputError('invalid-number', 'The bank temperature must be a number of °C.', [
      { path: 'conditions.bankTempC', message: 'not a number' },
    ]);
  }

  const fit = fitDecay(facts.samples, { ...facts.fitOptions, effectiveOhms });
  if (fit.status !== 'ok') return fit;

  const findings: VerdictFinding[] = [];
  const tau = fit.tauSeconds;
  const measuredMicrofarads = capacitanceFromTauMicrofarads(tau, effectiveOhms);
  const measuredCi95Microfarads: [number, number] = [
    capacitanceFromTauMicrofarads(fit.tauCi95[0], effectiveOhms),
    capacitanceFromTauMicrofarads(fit.tauCi95[1], effectiveOhms),
  ];

  // Temperature: normalise to 20 °C when both the temperature and the design's model are known.
  let at20CMicrofarads: number | null = null;
  let relativeToTwentyC = 1;
  if (conditions.bankTempC !== undefined && design.capacitanceTemperature) {
    const normalised = normaliseCapacitanceTo20C(
      measuredMicrofarads,
      conditions.bankTempC,
      design.capacitanceTemperature,
    );
    at20CMicrofarads = normalised.capacitanceAt20CMicrofarads;
    relativeToTwentyC = normalised.relativeToTwentyC;
    if (normalised.note)
      findings.push({ code: 'not-normalised', severity: 'info', message: normalised.note });
  } else if (conditions.bankTempC !== undefined) {
    findings.push({
      code: 'not-normalised',
      severity: 'info',
      message:
        'The design has no temperature coefficient or curve, so the capacitance is not normalised to 20 °C; compare runs at similar bank temperatures.',
    });
  } else if (design.capacitanceTemperature) {
    findings.push({
      code: 'not-normalised',
      severity: 'info',
      message:
        'No bank temperature was recorded, so the capacitance is not normalised to 20 °C. Record the bank temperature with each run.',
    });
  }
  const comparedMicrofarads = at20CMicrofarads ?? measuredMicrofarads;
  const nominalMicrofarads = design.construction
    ? bankCapacitanceMicrofarads(design.construction)
    : null;

  // Baseline: the one given, or the nameplate.
  let baselineFacts = facts.baseline;
  if (!baselineFacts && nominalMicrofarads !== null) {
    baselineFacts = { capacitanceMicrofarads: nominalMicrofarads, source: 'nameplate' };
    findings.push({
      code: 'baseline-from-nameplate',
      severity: 'info',
      message:
        'No baseline run is recorded for this bank, so the nameplate capacitance serves as the baseline. Units within their tolerance may read several per cent off nameplate; a trusted first run makes a better baseline.',
    });
  }
  let baseline: DecayVerdict['baseline'] = null;
  let health: HealthName | null = null;
  let notJudgedBecause: DecayVerdict['notJudgedBecause'] = 'no-baseline';
  if (baselineFacts) {
    const expectedTauSeconds =
      baselineFacts.tauSeconds ??
      baselineFacts.capacitanceMicrofarads * 1e-6 * relativeToTwentyC * designEffectiveOhms;
    const ratio = comparedMicrofarads / baselineFacts.capacitanceMicrofarads;
    const relativeError = fit.tauStdErrorSeconds / tau;
    baseline = {
      source: baselineFacts.source,
      capacitanceMicrofarads: baselineFacts.capacitanceMicrofarads,
      expectedTauSeconds,
      ratio,
      ratioStdError: ratio * relativeError,
      ratioCi95: [(ratio * fit.tauCi95[0]) / tau, (ratio * fit.tauCi95[1]) / tau],
      tauRatio: tau / expectedTauSeconds,
    };
    health = classifyHealth(ratio, limits);
    addTauFindings(findings, baseline, limits, tolerance, design.bleederOhms, measuredBleeder);
    if (baseline.tauRatio > 1 + tolerance && measuredBleeder === undefined)
      health = worseHealth(health, 'watch');
    const [low, high] = baseline.ratioCi95;
    const straddled = [limits.watchRatio, limits.endOfLifeRatio].find(
      (limit) => low < limit && high >= limit,
    );
    notJudgedBecause = null;
    if (!isPlausibleRatio(ratio)) {
      // far outside any ageing: the inputs are in doubt, so no health at all (never "healthy")
      health = null;
      notJudgedBecause = 'implausible-ratio';
      findings.push({
        code: 'implausible-ratio',
        severity: 'attention',
        message: `The capacitance is ${formatPercentFigure(ratio)} of the baseline, far outside any physical ageing (${formatPercentFigure(PLAUSIBLE_RATIO.low)} to ${formatPercentFigure(PLAUSIBLE_RATIO.high)}): check the bleeder value and the readings. The bank's health is not judged from this run.`,
      });
    } else if (straddled !== undefined) {
      findings.push({
        code: 'ratio-near-limit',
        severity: 'info',
        message: `The ratio's 95 % interval (${formatNumber(low, 3)} to ${formatNumber(high, 3)}) spans the limit ${formatNumber(straddled, 3)}; a repeat run would firm up the health.`,
      });
    }
  } else {
    findings.push({
      code: 'no-baseline',
      severity: 'info',
      message:
        'No baseline and no nameplate construction: the capacitance cannot be judged against a reference yet. Record this run as the baseline once it is trusted.',
    });
  }
  if (measuredBleeder !== undefined) {
    findings.push({
      code: 'measured-bleeder-used',
      severity: 'info',
      message: `The capacitance is computed with the measured bleeder resistance of ${formatOhms(measuredBleeder)} (design value ${formatOhms(design.bleederOhms)}).`,
    });
    const drift = measuredBleeder / design.bleederOhms - 1;
    if (Math.abs(drift) > tolerance) {
      findings.push({
        code: 'bleeder-drift',
        severity: drift > 0 ? 'safety' : 'attention',
        message:
          drift > 0
            ? `The measured bleeder resistance is ${formatPercent(drift)} above its design value: the bleeder has drifted up or a resistor has opened, so the bus discharges more slowly than designed. Replace the bleeder or balancing resistors.`
            : `The measured bleeder resistance is ${formatPercent(-drift)} below its design value: check the balancing resistors for damage or a parallel leakage path.`,
      });
    }
  }

  const meterWarning = assumedMeterWarning(bleederOhms, conditions.meterInputOhms);
  if (meterWarning !== null)
    findings.push({ code: 'meter-input-assumed', severity: 'attention', message: meterWarning });

  // Discharge safety: the bus on its own, without the meter, from the nominal bus voltage.
  const busTauSeconds = measuredMicrofarads * 1e-6 * bleederOhms;
  const busTauHigh95Seconds = measuredCi95Microfarads[1] * 1e-6 * bleederOhms;
  const baselineBusTauSeconds = baseline
    ? (baseline.expectedTauSeconds / designEffectiveOhms) * design.bleederOhms
    : undefined;
  const firstVolts = facts.samples[0]!.volts;
  const discharge = estimateDischargeSafety({
    busTauSeconds,
    busTauHigh95Seconds,
    fromVolts: cabinet.nominalBusVolts ?? firstVolts,
    fromSource: cabinet.nominalBusVolts !== undefined ? 'nominal-bus' : 'first-reading',
    ...(cabinet.markedWaitSeconds !== undefined
      ? { markedWaitSeconds: cabinet.markedWaitSeconds }
      : {}),
    ...(baselineBusTauSeconds !== undefined ? { baselineBusTauSeconds } : {}),
    riseTolerance: tolerance,
  });
  if (discharge.exceedsMarkedWait) {
    findings.push({
      code: 'discharge-exceeds-marked-wait',
      severity: 'safety',
      message: discharge.findings[0]!,
    });
  }
  if (discharge.grownAgainstBaseline && !findings.some((f) => f.code === 'tau-rise')) {
    findings.push({
      code: 'discharge-grown',
      severity: 'safety',
      message: discharge.findings[discharge.findings.length - 1]!,
    });
  }
  findings.push({
    code: 'iec-60204',
    severity: 'info',
    message: iec60204Sentence(discharge.safeAfterSeconds['60']),
  });

  if (fit.controlSupply) {
    const phase = fit.controlSupply;
    findings.push({
      code: 'control-supply-phase',
      severity: 'info',
      message: `The control supply was running at the start: ${phase.readingsBefore === 1 ? 'one reading' : `${phase.readingsBefore} readings`} before ${formatVolts(phase.kneeVolts)} at t = ${formatNumber(phase.kneeSeconds, 4)} s ${phase.readingsBefore === 1 ? 'was' : 'were'} left out${phase.powerWatts !== null ? ` (about ${formatNumber(phase.powerWatts, 2)} W drawn${phase.dropoutVolts !== null ? `, the supply dropping out near ${formatVolts(phase.dropoutVolts)}` : ''})` : ''}. A baseline is only comparable with the same drive options and I/O connected.`,
    });
  }
  const slips = fit.excluded.filter((reading) => reading.code !== 'control-supply-phase');
  if (slips.length > 0) {
    findings.push({
      code: 'readings-left-out',
      severity: 'attention',
      message: `${slips.length === 1 ? 'One reading was' : `${slips.length} readings were`} left out as off the curve: ${slips
        .slice(0, 3)
        .map((reading) => reading.reason)
        .join(' ')}${slips.length > 3 ? ' …' : ''}`,
    });
  }

  const order = { safety: 0, attention: 1, info: 2 } as const;
  findings.sort((a, b) => order[a.severity] - order[b.severity]);
  return {
    status: 'ok',
    fit,
    tauSeconds: tau,
    resistance: {
      bleederOhms,
      bleederSource: measuredBleeder !== undefined ? 'measured' : 'design',
      meterInputOhms,
      effectiveOhms,
    },
    capacitance: {
      measuredMicrofarads,
      measuredCi95Microfarads,
      at20CMicrofarads,
      comparedMicrofarads,
      nominalMicrofarads,
    },
    baseline,
    health,
    healthLabel: health ? HEALTH_LABELS[health] : null,
    notJudgedBecause,
    limits,
    findings,
    safetyFinding: findings.some((finding) => finding.severity === 'safety'),
    discharge,
    warnings: fit.warnings,
  };
}

function addTauFindings(
  findings: VerdictFinding[],
  baseline: NonNullable<DecayVerdict['baseline']>,
  limits: HealthLimits,
  tolerance: number,
  designBleederOhms: number,
  measuredBleederOhms: number | undefined,
): void {
  const change = baseline.tauRatio - 1;
  if (change > tolerance) {
    let message: string;
    if (measuredBleederOhms === undefined) {
      message = `τ is ${formatPercent(change)} longer than the baseline: most likely the bleeder's resistance has risen or a balancing resistor has opened (capacitance does not grow with age). The bus stays dangerous for longer: a safety finding. Measure the bleeder resistance with the bus discharged; until then the capacitance figure cannot be trusted.`;
    } else if (measuredBleederOhms / designBleederOhms - 1 > tolerance) {
      message = `τ is ${formatPercent(change)} longer than the baseline, and the measured bleeder confirms it: its resistance is ${formatPercent(measuredBleederOhms / designBleederOhms - 1)} above design. The bus stays dangerous for longer: a safety finding.`;
    } else {
      message = `τ is ${formatPercent(change)} longer than the baseline although the measured bleeder is within tolerance; a rise in capacitance is unusual. The bus stays dangerous for longer: check the baseline, the bank temperature and the meter, and repeat the run.`;
    }
    findings.push({ code: 'tau-rise', severity: 'safety', message });
    return;
  }
  if (baseline.ratio < limits.watchRatio || change < -tolerance) {
    const share = formatPercent(baseline.ratio, 3);
    const message =
      measuredBleederOhms === undefined
        ? `The capacitance is ${share} of the baseline (τ ${formatPercent(-change)} shorter): capacitance loss, or a bleeder whose resistance fell, which shortens τ the same way. Measure the bleeder resistance with the bus discharged to tell them apart.`
        : `The capacitance is ${share} of the baseline, computed with the measured bleeder resistance: this is capacitance loss.`;
    findings.push({ code: 'capacitance-loss', severity: 'attention', message });
  }
}

function positiveOrAbsent(value: number | undefined, path: string, what: string): void {
  if (value === undefined) return;
  if (typeof value !== 'number' || !(value > 0) || !Number.isFinite(value)) {
    throw new EngineInputError(
      'invalid-option',
      `${what} must be a positive number, got ${String(value)}.`,
      [{ path, message: 'must be positive' }],
    );
  }
}
