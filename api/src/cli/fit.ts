/**
 * `npm run -s fit -- FILE.csv --bleeder-ohms R [options]`: judges one decay run from a logger or
 * handheld CSV file (`-` reads standard input) and prints one JSON object on stdout. The file is
 * read as loggers write it (shared/domain/samples-csv.ts): any encoding of UTF-8, UTF-16 with a
 * byte-order mark or Latin-1, a preamble before the header, clock or ISO times, repeated times,
 * the tail at 0 V and pre-trigger readings; what was left out is listed in `fileRead.notes`.
 *
 * Options (resistances accept a k or M suffix, e.g. 94k, 10M):
 *   --bleeder-ohms R            bleeder resistance across the bus (required)
 *   --meter-ohms M              meter or logger input resistance (default 10 MΩ, with a warning:
 *                               loggers differ; 0 = no meter loading)
 *   --time-column C             the time column, by header text or number (when the names do not tell)
 *   --volts-column C            the voltage column, by header text or number (e.g. "CH1 (V)" or 2)
 *   --temp-c T                  bank temperature during the run, °C
 *   --temp-coeff-per-k A        the design's capacitance temperature coefficient (e.g. 0.002)
 *   --baseline-uf C             baseline capacitance at 20 °C, µF (adds ratioToBaseline, health)
 *   --nominal-volts V           nominal bus voltage, start of the discharge estimate
 *   --marked-wait-s S           wait time marked on the cabinet, seconds
 *   --measured-bleeder-ohms R   bleeder resistance measured with the bus discharged
 *   --technology T              electrolytic (default) or film: default health limits
 *   --meter-noise-volts A       the meter's own constant noise, volts (a floor for the fit's weights)
 *   --meter-noise-percent B     the meter's noise in proportion to the reading, % (e.g. 0.1)
 *   --timing-jitter-s D         scatter of the moment each reading was taken, seconds (handheld: ~0.5)
 *
 * Bad input or unusable data: exit status 2, one message on stderr, nothing on stdout.
 */

import { parseArgs } from 'node:util';
import { defineCli, readInputBytes, runIfEntryPoint, UsageError, type CliIo } from './cli-shell';
import {
  EngineInputError,
  judgeDecayRun,
  parseDecaySamplesCsv,
  type DecayRunFacts,
  type DecaySamplesCsv,
  type DecaySamplesCsvOptions,
} from '../../../shared/domain';
import { CAPACITOR_TECHNOLOGIES, type CapacitorTechnology } from '../../../shared/constants/health';
import { DISCHARGE_CAUTION_TEXT } from '../../../shared/constants/safety';

const USAGE =
  'usage: npm run -s fit -- FILE.csv --bleeder-ohms R [--meter-ohms M] [--time-column C] [--volts-column C] [--temp-c T] [--temp-coeff-per-k A] [--baseline-uf C] [--nominal-volts V] [--marked-wait-s S] [--measured-bleeder-ohms R] [--technology electrolytic|film] [--meter-noise-volts A] [--meter-noise-percent B] [--timing-jitter-s D]';

const VALUE_OPTIONS = [
  'bleeder-ohms',
  'meter-ohms',
  'temp-c',
  'temp-coeff-per-k',
  'baseline-uf',
  'nominal-volts',
  'marked-wait-s',
  'measured-bleeder-ohms',
  'technology',
  'time-column',
  'volts-column',
  'meter-noise-volts',
  'meter-noise-percent',
  'timing-jitter-s',
] as const;

function fitCommand(argv: string[], io: CliIo): void {
  const { values, positionals } = parseArgs({
    args: joinNegativeValues(argv),
    options: {
      ...Object.fromEntries(VALUE_OPTIONS.map((name) => [name, { type: 'string' as const }])),
      help: { type: 'boolean' as const },
    },
    allowPositionals: true,
    strict: true,
  }) as {
    values: Partial<Record<(typeof VALUE_OPTIONS)[number], string>> & { help?: boolean };
    positionals: string[];
  };
  if (values.help) {
    io.stdout.write(`${USAGE}\n`);
    return;
  }
  if (positionals.length !== 1)
    throw new UsageError(
      positionals.length === 0
        ? 'no CSV file given'
        : `one CSV file expected, got ${positionals.length}`,
    );
  const file = positionals[0]!;
  if (values['bleeder-ohms'] === undefined)
    throw new UsageError(
      '--bleeder-ohms is required (the bleeder resistance across the bus, e.g. 94k)',
    );
  const bleederOhms = ohms(values['bleeder-ohms'], '--bleeder-ohms', false);
  const meterOhms =
    values['meter-ohms'] === undefined
      ? undefined
      : ohms(values['meter-ohms'], '--meter-ohms', true);
  const tempC = optionalNumber(values['temp-c'], '--temp-c', 'any');
  const coefficient = optionalNumber(values['temp-coeff-per-k'], '--temp-coeff-per-k', 'any');
  const baselineUf = optionalNumber(values['baseline-uf'], '--baseline-uf', 'positive');
  const nominalVolts = optionalNumber(values['nominal-volts'], '--nominal-volts', 'positive');
  const markedWait = optionalNumber(values['marked-wait-s'], '--marked-wait-s', 'positive');
  const measuredBleeder =
    values['measured-bleeder-ohms'] === undefined
      ? undefined
      : ohms(values['measured-bleeder-ohms'], '--measured-bleeder-ohms', false);
  const technology = (values.technology ?? 'electrolytic') as CapacitorTechnology;
  if (!CAPACITOR_TECHNOLOGIES.includes(technology))
    throw new UsageError(`--technology must be electrolytic or film, got "${values.technology}"`);

  // what is known of the meter's scatter: floors under the noise the fit estimates itself
  const noiseVolts = optionalNumber(values['meter-noise-volts'], '--meter-noise-volts', 'positive');
  const noisePercent = optionalNumber(
    values['meter-noise-percent'],
    '--meter-noise-percent',
    'positive',
  );
  const jitterSeconds = optionalNumber(values['timing-jitter-s'], '--timing-jitter-s', 'positive');
  const noise = {
    ...(noiseVolts !== undefined ? { volts: noiseVolts } : {}),
    ...(noisePercent !== undefined ? { fractionOfReading: noisePercent / 100 } : {}),
    ...(jitterSeconds !== undefined ? { timingJitterSeconds: jitterSeconds } : {}),
  };

  const csv = readSamples(readInputBytes(file, io), {
    ...(values['time-column'] !== undefined ? { timeColumn: values['time-column'] } : {}),
    ...(values['volts-column'] !== undefined ? { voltsColumn: values['volts-column'] } : {}),
  });
  const facts: DecayRunFacts = {
    samples: csv.samples,
    design: {
      technology,
      bleederOhms,
      ...(coefficient !== undefined
        ? { capacitanceTemperature: { kind: 'coefficient' as const, perKelvin: coefficient } }
        : {}),
    },
    ...(baselineUf !== undefined
      ? { baseline: { capacitanceMicrofarads: baselineUf, source: 'decay-run' as const } }
      : {}),
    cabinet: {
      ...(nominalVolts !== undefined ? { nominalBusVolts: nominalVolts } : {}),
      ...(markedWait !== undefined ? { markedWaitSeconds: markedWait } : {}),
    },
    conditions: {
      ...(meterOhms !== undefined ? { meterInputOhms: meterOhms } : {}),
      ...(tempC !== undefined ? { bankTempC: tempC } : {}),
      ...(measuredBleeder !== undefined ? { measuredBleederOhms: measuredBleeder } : {}),
    },
    ...(Object.keys(noise).length ? { fitOptions: { noise } } : {}),
  };
  const verdict = judgeDecayRun(facts);
  if (verdict.status !== 'ok') throw new UsageError(`unusable decay run: ${verdict.reason}`);

  const { fit } = verdict;
  const alreadyWarned = new Set(['readings-left-out', 'control-supply-phase']);
  const warnings = [
    ...fit.warnings,
    ...verdict.findings
      .filter((f) => f.severity !== 'info' && !alreadyWarned.has(f.code))
      .map((f) => f.message),
  ];
  if (meterOhms === undefined && !verdict.findings.some((f) => f.code === 'meter-input-assumed')) {
    warnings.push(
      "No --meter-ohms given: a 10 MΩ meter was assumed. Give the meter's or logger's input resistance (0 for none); loggers differ.",
    );
  }
  if (nominalVolts === undefined) {
    warnings.push(
      `No --nominal-volts given: the discharge estimate starts from the first reading (${csv.samples[0]!.volts} V).`,
    );
  }
  const output: Record<string, unknown> = {
    file,
    fileRead: {
      encoding: csv.encoding,
      lineEnds: csv.lineEnds,
      headerRow: csv.headerRow,
      timeColumn: csv.timeColumn,
      voltageColumn: csv.voltageColumn,
      timeFormat: csv.timeFormat,
      readings: csv.samples.length,
      notes: csv.notes,
    },
    tauSeconds: fit.tauSeconds,
    tauCi95: fit.tauCi95,
    tauStdErrorSeconds: fit.tauStdErrorSeconds,
    v0Volts: fit.v0Volts,
    capacitanceMicrofarads: verdict.capacitance.measuredMicrofarads,
    capacitanceCi95Microfarads: verdict.capacitance.measuredCi95Microfarads,
    capacitanceAt20CMicrofarads: verdict.capacitance.at20CMicrofarads,
    effectiveOhms: verdict.resistance.effectiveOhms,
    bleederOhms: verdict.resistance.bleederOhms,
    bleederSource: verdict.resistance.bleederSource,
    meterInputOhms: verdict.resistance.meterInputOhms,
    rmseVolts: fit.rmseVolts,
    // the readings' scatter the fit weighted by (estimated, never below what was given)
    noise: fit.noise,
    r2: fit.r2,
    pointsUsed: fit.pointsUsed,
    pointsTotal: fit.pointsTotal,
    excluded: fit.excluded.map((reading) => ({
      row: csv.rowNumbers[reading.index],
      tSeconds: reading.tSeconds,
      volts: reading.volts,
      code: reading.code,
      reason: reading.reason,
    })),
    kneeSeconds: fit.controlSupply?.kneeSeconds ?? null,
    kneeVolts: fit.controlSupply?.kneeVolts ?? null,
    controlSupplyWatts: fit.controlSupply?.powerWatts ?? null,
    safeAfterSeconds: verdict.discharge.safeAfterSeconds,
    safeAfterSecondsHigh95: verdict.discharge.safeAfterSecondsHigh95,
    safeAfterFromVolts: verdict.discharge.fromVolts,
    exceedsMarkedWait: verdict.discharge.exceedsMarkedWait,
  };
  if (baselineUf !== undefined && verdict.baseline) {
    output.ratioToBaseline = verdict.baseline.ratio;
    output.ratioCi95 = verdict.baseline.ratioCi95;
    output.tauRatioToBaseline = verdict.baseline.tauRatio;
    output.health = verdict.health;
    output.healthLabel = verdict.healthLabel;
  }
  output.safetyFinding = verdict.safetyFinding;
  output.findings = verdict.findings;
  output.warnings = warnings;
  output.caution = DISCHARGE_CAUTION_TEXT;
  io.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
}

/** Reads the samples; a column question from the reader gets the option that answers it. */
function readSamples(bytes: Uint8Array, options: DecaySamplesCsvOptions): DecaySamplesCsv {
  try {
    return parseDecaySamplesCsv(bytes, options);
  } catch (error) {
    const path = error instanceof EngineInputError ? error.issues[0]?.path : undefined;
    if (path === 'voltsColumn' || path === 'timeColumn') {
      const flag = path === 'voltsColumn' ? '--volts-column' : '--time-column';
      throw new UsageError(`${(error as Error).message} (${flag} NAME or NUMBER)`);
    }
    throw error;
  }
}

/** parseArgs reads "--temp-c -5" as a missing value; pass it as "--temp-c=-5". */
function joinNegativeValues(argv: string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    const next = argv[i + 1];
    if (
      arg.startsWith('--') &&
      !arg.includes('=') &&
      next !== undefined &&
      /^-\d|^-\.\d/.test(next)
    ) {
      out.push(`${arg}=${next}`);
      i++;
    } else {
      out.push(arg);
    }
  }
  return out;
}

function optionalNumber(
  raw: string | undefined,
  flag: string,
  kind: 'any' | 'positive',
): number | undefined {
  if (raw === undefined) return undefined;
  const value = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(raw.trim()) ? Number(raw) : NaN;
  if (!Number.isFinite(value) || (kind === 'positive' && !(value > 0))) {
    throw new UsageError(
      `${flag} must be ${kind === 'positive' ? 'a positive number' : 'a number'}, got "${raw}"`,
    );
  }
  return value;
}

/** Ohms with an optional k or M suffix ("94k", "4.7M"); `allowZero` for the meter (0 = none). */
function ohms(raw: string, flag: string, allowZero: boolean): number {
  const match = /^(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*([kKM])?\s*(ohms?|Ω)?$/.exec(raw.trim());
  const scale = match?.[3] === undefined ? 1 : match[3] === 'M' ? 1e6 : 1e3;
  const value = match ? Number(`${match[1]}${match[2] ?? ''}`) * scale : NaN;
  if (!Number.isFinite(value) || value < 0 || (!allowZero && value === 0)) {
    throw new UsageError(
      `${flag} must be a ${allowZero ? 'non-negative' : 'positive'} resistance in ohms (e.g. 94000, 94k, 10M), got "${raw}"`,
    );
  }
  return value;
}

/**
 * The `fit` tool: `argv` without `node` and the script, `io` the streams (default the
 * process's own). Returns the exit status: 0 done, 2 bad input or unusable data, 1 a fault.
 *
 * @example main(['run.csv', '--bleeder-ohms', '94k'], { stdout, stderr }) // → 0
 */
export const main = defineCli('fit', fitCommand);

runIfEntryPoint(import.meta.url, main);
