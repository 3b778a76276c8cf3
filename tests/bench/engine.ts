/**
 * Engine speed benchmark: `npm run bench:engine`. Prints medians (no assertions) for
 *   1. a 20-point handheld decay fit (fits per second on one core),
 *   2. a 100,000-sample logger file parsed and fitted (milliseconds),
 *   3. a 10-year trend forecast (milliseconds),
 * and, for comparison, the same 20-point runs fitted bare in plain JavaScript (the ceiling: no
 * screening, weights or interval) and by ml-levenberg-marquardt (the general-purpose package the
 * engine's own Levenberg–Marquardt is checked against), measured in the same run. All data are
 * invented.
 */

import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import Papa from 'papaparse';
import { fitDecay } from '../../shared/domain/decay-fit';
import { parseDecaySamplesCsv } from '../../shared/domain/samples-csv';
import { forecastEndOfLife, type RatioHistoryPoint } from '../../shared/domain/trend-forecast';
import { controlSupplyDecayVolts } from '../../shared/domain/control-supply';
import { fitLogLinear } from '../../shared/domain/exponential-least-squares';
import { addDays } from '../../shared/domain/calendar-dates';
import { seededRandom } from '../../infra/seed/seeded-random';

const random = seededRandom(2024);
const gaussian = (): number =>
  Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Runs `body` `rounds` times (after `warmup` untimed runs) and returns each round's milliseconds. */
function time(rounds: number, warmup: number, body: () => void): number[] {
  for (let i = 0; i < warmup; i++) body();
  const out: number[] = [];
  for (let i = 0; i < rounds; i++) {
    const start = performance.now();
    body();
    out.push(performance.now() - start);
  }
  return out;
}

// 1. Handheld: 200 different 20-point runs, read every 30 s to whole volts (as typed from a meter).
const handheldRuns = Array.from({ length: 200 }, () => {
  const tau = 150 + 150 * random();
  const v0 = 540 + 30 * random();
  return Array.from({ length: 20 }, (_, i) => ({
    tSeconds: i * 30,
    volts: Math.round(v0 * Math.exp((-i * 30) / tau) + 0.3 * gaussian()),
  }));
});
let sink = 0;
const handheldRounds = time(15, 3, () => {
  for (let repeat = 0; repeat < 10; repeat++) {
    for (const run of handheldRuns) {
      const fit = fitDecay(run);
      if (fit.status === 'ok') sink += fit.tauSeconds;
    }
  }
});
const fitsPerRound = 10 * handheldRuns.length;
const handheldMs = median(handheldRounds) / fitsPerRound;

// Ceiling: a bare fit of the same runs in plain JavaScript: a log-linear start and Gauss–Newton
// steps on the volts, no screening, no weights, no interval. What the engine adds (robust
// screening, the knee scan, noise weighting, the interval) is the ratio to this.
function plainFit(run: { tSeconds: number; volts: number }[]): number {
  let sw = 0,
    st = 0,
    sy = 0,
    stt = 0,
    sty = 0;
  for (const { tSeconds, volts } of run) {
    const w = volts * volts;
    const y = Math.log(volts);
    sw += w;
    st += w * tSeconds;
    sy += w * y;
    stt += w * tSeconds * tSeconds;
    sty += w * tSeconds * y;
  }
  let rate = -(sty - (st * sy) / sw) / (stt - (st * st) / sw);
  let v0 = Math.exp((sy + rate * st) / sw);
  for (let step = 0; step < 8; step++) {
    let a11 = 0,
      a12 = 0,
      a22 = 0,
      g1 = 0,
      g2 = 0;
    for (const { tSeconds, volts } of run) {
      const e = Math.exp(-rate * tSeconds);
      const j2 = -v0 * tSeconds * e;
      const r = volts - v0 * e;
      a11 += e * e;
      a12 += e * j2;
      a22 += j2 * j2;
      g1 += e * r;
      g2 += j2 * r;
    }
    const det = a11 * a22 - a12 * a12;
    v0 += (a22 * g1 - a12 * g2) / det;
    rate += (a11 * g2 - a12 * g1) / det;
  }
  return 1 / rate;
}
const plainRounds = time(15, 3, () => {
  for (let repeat = 0; repeat < 10; repeat++) for (const run of handheldRuns) sink += plainFit(run);
});
const plainMs = median(plainRounds) / fitsPerRound;

// Reference: the same fit by ml-levenberg-marquardt with analytic derivatives, from the same start.
const referenceRuns = handheldRuns.slice(0, 50);
const referenceRounds = time(7, 1, () => {
  for (const run of referenceRuns) {
    const t = run.map((s) => s.tSeconds);
    const v = run.map((s) => s.volts);
    const start = fitLogLinear(t, v)!;
    const result = levenbergMarquardt(
      { x: t, y: v },
      ([a, k]) =>
        (x: number) =>
          a! * Math.exp(-k! * x),
      {
        initialValues: [start.v0Volts, start.ratePerSecond],
        jacobianFunction:
          ([a, k]) =>
          (x: number) => [Math.exp(-k! * x), -a! * x * Math.exp(-k! * x)],
        maxIterations: 100,
        errorTolerance: 1e-10,
      },
    );
    sink += result.parameterValues[1]!;
  }
});
const referenceMs = median(referenceRounds) / referenceRuns.length;

// 2. Logger: 100,000 samples at 10 Hz, semicolon separated with decimal commas, with a preamble,
//    a control-supply phase and noise, as a logger exports them.
const bank = {
  v0Volts: 565,
  tauSeconds: 2200,
  controlSupplyWatts: 40,
  effectiveOhms: 330_000,
  dropoutVolts: 320,
};
const lines = [
  'Logger export, cabinet CB-07 drive 2',
  'Sample rate 10 Hz',
  '',
  'Time (s);DC bus voltage [V];Temp (°C)',
];
for (let i = 0; i < 100_000; i++) {
  const t = i * 0.1;
  const v = controlSupplyDecayVolts(bank, t) + 0.15 * gaussian();
  lines.push(
    `${t.toFixed(1).replace('.', ',')};${v.toFixed(2).replace('.', ',')};24,${Math.floor(random() * 10)}`,
  );
}
const loggerText = lines.join('\n');
const loggerRounds = time(11, 2, () => {
  const csv = parseDecaySamplesCsv(loggerText);
  const fit = fitDecay(csv.samples);
  if (fit.status === 'ok') sink += fit.tauSeconds;
});
const parseOnly = time(11, 1, () => {
  sink += parseDecaySamplesCsv(loggerText).samples.length;
});
// The floor under the reader: papaparse tokenizing the same file and nothing else.
const papaparseOnly = time(11, 1, () => {
  sink += Papa.parse<string[]>(loggerText, { delimiter: ';', newline: '\n' }).data.length;
});

// 3. Ten years of half-yearly runs, with an accelerating decline and scatter.
const history: RatioHistoryPoint[] = Array.from({ length: 21 }, (_, i) => {
  const years = i / 2;
  return {
    measuredOn: addDays('2015-04-01', Math.round(years * 365.2425)),
    ratio: 1 - 0.006 * years - 0.0009 * years * years + 0.003 * gaussian(),
    ratioStdError: 0.004,
  };
});
const forecastRounds = time(25, 5, () => {
  const forecast = forecastEndOfLife({
    history,
    endOfLifeRatio: 0.8,
    watchRatio: 0.9,
    asOfOn: '2025-05-01',
  });
  if (forecast.status === 'ok') sink += forecast.ratioNow;
});

const format = (value: number, digits = 3): string =>
  Number(value.toPrecision(digits)).toLocaleString('en-GB');
console.log('Ebbline engine benchmark (medians, one core)');
console.log(
  `  20-point handheld fit:            ${format(handheldMs * 1000)} µs per fit = ${format(1000 / handheldMs)} fits per second   (target ≥ 20,000)`,
);
console.log(
  `  100,000-sample logger file:       ${format(median(loggerRounds))} ms parsed and fitted (parse alone ${format(median(parseOnly))} ms; papaparse's tokenizing alone ${format(median(papaparseOnly))} ms)   (target < 300 ms)`,
);
console.log(
  `  10-year trend forecast:           ${format(median(forecastRounds))} ms (21 runs, both models, 90 % interval)`,
);
console.log(
  `  ceiling: a bare plain-JavaScript fit of the same runs: ${format(plainMs * 1000)} µs per fit = ${format(1000 / plainMs)} fits per second; the engine takes ${format(handheldMs / plainMs)}× as long`,
);
console.log(
  `  reference: ml-levenberg-marquardt 20-point fit: ${format(referenceMs * 1000)} µs per fit = ${format(1000 / referenceMs)} fits per second`,
);
if (!Number.isFinite(sink)) console.log('(checksum not finite)');
