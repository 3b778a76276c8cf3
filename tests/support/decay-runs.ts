/**
 * Decay runs for tests: readings of V0·e^(−t/τ) and a valid run body. Pure (no database, no
 * browser), so API, web, e2e and seed tests can all use it.
 */
import type { DecayRunCorrectionInput, DecayRunInput } from '../../shared/schemas/decay-run';

/** One reading as the API takes it. */
export interface TestSample {
  tSeconds: number;
  volts: number;
}

/**
 * Readings of V0·e^(−t/τ): `count` readings `stepSeconds` apart from t = 0 (by default spaced to
 * reach about 5 τ), optionally with a deterministic ripple of `noiseVolts` and rounding.
 *
 * @example decaySamples({ tauSeconds: 330, v0Volts: 540, count: 20 }) // [{ tSeconds: 0, volts: 540 }, ...]
 */
export function decaySamples(options: {
  tauSeconds: number;
  v0Volts?: number;
  count?: number;
  stepSeconds?: number;
  /** Amplitude of a deterministic ± ripple, volts (alternating sign, varying size). */
  noiseVolts?: number;
  /** Round each reading to this step, volts (e.g. 0.1 for a meter's last digit). */
  roundToVolts?: number;
}): TestSample[] {
  const v0Volts = options.v0Volts ?? 540;
  const count = options.count ?? 20;
  const stepSeconds = options.stepSeconds ?? Math.max(1, Math.round((5 * options.tauSeconds) / Math.max(1, count - 1)));
  return Array.from({ length: count }, (_, i) => {
    const tSeconds = i * stepSeconds;
    let volts = v0Volts * Math.exp(-tSeconds / options.tauSeconds);
    if (options.noiseVolts) volts += options.noiseVolts * (i % 2 === 0 ? 1 : -1) * (0.5 + ((i * 7) % 5) / 8);
    if (options.roundToVolts) volts = Math.round(volts / options.roundToVolts) * options.roundToVolts;
    return { tSeconds, volts: Number(volts.toFixed(6)) };
  });
}

/**
 * τ of a healthy bank of tests/support/register.ts's design (3 strings of 2 × 4700 µF = 7050 µF,
 * 47 kΩ bleeder) read with a 10 MΩ meter: 7050 µF × (47 kΩ ∥ 10 MΩ) ≈ 329.8 s.
 */
export const TEST_DESIGN_HEALTHY_TAU_SECONDS = 7050e-6 * ((47_000 * 10e6) / (47_000 + 10e6));

/** The default moment of isolation of {@link validRunInput}. */
export const TEST_ISOLATED_AT = '2027-01-09T06:00:00.000Z';

type RunOverrides = Partial<Omit<DecayRunInput, 'safety' | 'observations'>> & {
  safety?: Partial<DecayRunInput['safety']>;
  observations?: Partial<DecayRunInput['observations']>;
};

/**
 * A valid body of `POST /api/visits/:visitId/decay-runs` for `bankId`: a healthy run of the test
 * design typed at the prompts, every safety check confirmed, a fresh clientId. `overrides`
 * replace fields; `safety` and `observations` are merged into the defaults.
 *
 * @example validRunInput(bank.id, { observations: { visualFindings: ['leak'] } })
 */
export function validRunInput(bankId: string, overrides: RunOverrides = {}): DecayRunInput {
  const { safety, observations, ...rest } = overrides;
  const samples = rest.samples ?? decaySamples({ tauSeconds: TEST_DESIGN_HEALTHY_TAU_SECONDS, v0Volts: 540 });
  const isolatedAt = rest.isolatedAt ?? TEST_ISOLATED_AT;
  const lastSeconds = samples.length > 0 ? samples[samples.length - 1]!.tSeconds : 0;
  const confirmedAt = new Date(Date.parse(isolatedAt) + (lastSeconds + 30) * 1000).toISOString();
  return {
    clientId: crypto.randomUUID(),
    bankId,
    source: 'guided',
    isolatedAt,
    samples,
    ...rest,
    safety: {
      qualifiedPerson: true,
      lockoutTagoutApplied: true,
      meterRatedAndProved: true,
      meterOnTestPoints: true,
      absenceOfVoltageVerified: true,
      confirmedAt,
      ...safety,
    },
    observations: {
      bankTempC: 28,
      meterName: 'Handheld DMM, 1000 V CAT III',
      meterInputOhms: 10_000_000,
      notes: '',
      visualFindings: [],
      ...observations,
    },
  };
}

/** A valid correction body of a run on the same bank: a new clientId, the run's fields, and a reason. */
export function validCorrectionInput(
  overrides: Omit<RunOverrides, 'bankId'> & { reason?: string } = {},
): DecayRunCorrectionInput {
  const { reason, ...rest } = overrides;
  const { bankId: _bankId, ...body } = validRunInput('00000000-0000-4000-8000-000000000000', rest);
  return { ...body, reason: reason ?? 'The reading at 2 min was typed as 412 V; the sheet says 421 V.' };
}
