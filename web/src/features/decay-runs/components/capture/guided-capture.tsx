import { useEffect, useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { CAPTURE_END_VOLTS, SAFETY_CHECKS } from '../../../../../../shared/constants/decay-runs';
import type { BankEngineInputs, DecaySample } from '../../../../../../shared/domain';
import { captureScheduleSeconds } from '../../../../../../shared/domain/capture-schedule';
import type { RecordedRunVerdict } from '../../../../../../shared/domain/recorded-run';
import { explainVerdict } from '../../../../../../shared/domain/verdict-explanation';
import { SAMPLE_VOLTS } from '../../../../../../shared/schemas/decay-run';
import { Button } from '../../../../components/ui/button';
import { inputClass } from '../../../../components/ui/field';
import { todayOn } from '../../utils/figures';
import { readDecimal } from '../../utils/readings';
import { DecayPlot } from '../decay-plot';
import { clockText } from './capture-facts';
import { liveFit, type LiveFit } from './live-fit';
import { BigCheck } from './safety-gate';
import { StepActions } from './step-actions';

/** The sentence of the last safety check, confirmed when the capture has ended. */
export const ABSENCE_CHECK = SAFETY_CHECKS.find(
  (check) => check.key === 'absenceOfVoltageVerified',
)!;

/** Below this many prompts to 5 τ the bank discharges too fast to follow by hand. */
const MIN_HAND_PROMPTS = 5;

/** Props of {@link GuidedCapture}; the parent keeps the state (and the draft) and passes it back. */
export interface GuidedCaptureProps {
  /** The bank's expected τ, seconds: the prompts are timed from it. */
  expectedTauSeconds: number;
  /** The bank's figures for the live verdict; null when they are not at hand (offline): the fit alone is shown. */
  engine: BankEngineInputs | null;
  /** The moment of isolation (UTC ISO) once Start was pressed. */
  isolatedAt: string | undefined;
  /** The readings so far, seconds since isolation, in time order. */
  samples: readonly DecaySample[];
  /** True once the capture has ended (a reading below 50 V, or Stop). */
  ended: boolean;
  /** True once absence of voltage was confirmed. */
  absenceConfirmed: boolean;
  onStart: (isolatedAt: string) => void;
  onSamples: (samples: DecaySample[]) => void;
  onEnded: (ended: boolean) => void;
  onAbsenceConfirmed: (confirmed: boolean) => void;
  /** Absence of voltage confirmed: on to the observations. */
  onFinish: () => void;
}

/**
 * The guided capture at the cabinet: a large Start pressed at the moment of isolation, a
 * running clock, prompts at the times of the capture schedule (a yellow, pulsing card, a short
 * beep and a buzz), a large input for the meter's reading, each reading on the chart with the
 * live fit and, once the fit can be trusted, the verdict in plain words. The capture ends below
 * 50 V or on Stop, and closes with the confirmation that absence of voltage was verified.
 *
 * A reading typed while a prompt is waiting gets the prompt's time (the meter was read at the
 * cue); one typed with no prompt waiting gets the time it was recorded. The screen says which.
 */
export function GuidedCapture(props: GuidedCaptureProps) {
  const { expectedTauSeconds, isolatedAt } = props;
  const schedule = useMemo(() => captureScheduleSeconds(expectedTauSeconds), [expectedTauSeconds]);
  const fit = useMemo(() => liveFit(props.samples, props.engine), [props.samples, props.engine]);

  if (!isolatedAt)
    return (
      <BeforeStart
        schedule={schedule}
        expectedTauSeconds={expectedTauSeconds}
        onStart={props.onStart}
      />
    );
  return <Running {...props} isolatedAt={isolatedAt} schedule={schedule} fit={fit} />;
}

function BeforeStart({
  schedule,
  expectedTauSeconds,
  onStart,
}: {
  schedule: number[];
  expectedTauSeconds: number;
  onStart: (at: string) => void;
}) {
  const tooFast = schedule.filter((t) => t <= 5 * expectedTauSeconds).length < MIN_HAND_PROMPTS;
  return (
    <div className="space-y-4" data-testid="guided-before-start">
      <ol className="list-decimal space-y-1 pl-5 text-base text-tide-900">
        <li>Keep the meter on the DC-bus test points, reading DC volts.</li>
        <li>
          Press Start at the very moment the drive’s supply is switched off: the readings count from
          then.
        </li>
        <li>
          When the card turns yellow and the phone beeps, read the meter and type the voltage.
        </li>
      </ol>
      <p className="text-sm text-tide-800">
        The first readings come every {schedule[0]} s, then further apart: {schedule.length} prompts
        over about {Math.round(schedule.at(-1)! / 60)} min at most. The capture ends by itself below{' '}
        {CAPTURE_END_VOLTS} V.
      </p>
      {tooFast ? (
        <p
          className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950"
          data-testid="guided-too-fast"
        >
          This bank is expected to discharge within seconds (τ about{' '}
          {Math.round(expectedTauSeconds)} s): readings by hand cannot follow it. Use a logger and
          read its file instead, if you can.
        </p>
      ) : null}
      <Button
        variant="primary"
        className="min-h-20 w-full text-xl"
        onClick={() => {
          unlockCue();
          onStart(new Date(Date.now()).toISOString());
        }}
      >
        Start: isolated now
      </Button>
    </div>
  );
}

/** The index of the latest prompt due at `elapsed` seconds (the schedule goes on at its last spacing), or -1. */
function promptAt(schedule: readonly number[], index: number): number {
  if (index < schedule.length) return schedule[index]!;
  const last = schedule.at(-1)!;
  const gap = schedule.length > 1 ? last - schedule.at(-2)! : last;
  return last + (index - schedule.length + 1) * gap;
}

function latestPromptIndex(schedule: readonly number[], elapsed: number): number {
  let index = -1;
  while (promptAt(schedule, index + 1) <= elapsed) index++;
  return index;
}

/** Milliseconds since the epoch, ticking while `active`. */
function useNow(active: boolean): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!active) return;
    const timer = setInterval(() => setNow(Date.now()), 250);
    return () => clearInterval(timer);
  }, [active]);
  return now;
}

function Running(
  props: GuidedCaptureProps & { isolatedAt: string; schedule: number[]; fit: LiveFit },
) {
  const { schedule, samples, ended, fit } = props;
  const now = useNow(!ended);
  const elapsed = Math.max(0, (now - Date.parse(props.isolatedAt)) / 1000);
  const index = latestPromptIndex(schedule, elapsed);
  const answered = useMemo(() => new Set(samples.map((s) => s.tSeconds)), [samples]);
  const dueAt =
    index >= 0 && !answered.has(promptAt(schedule, index)) && !ended
      ? promptAt(schedule, index)
      : null;
  const nextAt = promptAt(schedule, index + 1);
  const [typed, setTyped] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [lastStamp, setLastStamp] = useState<string | null>(null);
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);

  // one cue per prompt, when it falls due
  const cued = useRef(-1);
  useEffect(() => {
    if (dueAt !== null && index > cued.current) {
      cued.current = index;
      cue();
    }
  }, [dueAt, index]);

  useWakeLock(!ended);
  // after a reload the browser keeps sound off until the next tap
  const [soundOn, setSoundOn] = useState(() => audio?.state === 'running');
  useEffect(() => {
    const context = audio;
    if (!context) return;
    const follow = () => setSoundOn(context.state === 'running');
    context.addEventListener('statechange', follow);
    return () => context.removeEventListener('statechange', follow);
  }, [soundOn]);

  function record(event: FormEvent) {
    event.preventDefault();
    const volts = readDecimal(typed);
    if (volts === null) return setProblem('Type the voltage as a number, e.g. 412 or 412,5.');
    if (volts < SAMPLE_VOLTS.min || volts > SAMPLE_VOLTS.max) {
      return setProblem(
        `A reading is between ${SAMPLE_VOLTS.min} and ${SAMPLE_VOLTS.max} V: check the number.`,
      );
    }
    const atNow = Math.max(0, (Date.now() - Date.parse(props.isolatedAt)) / 1000);
    let tSeconds = dueAt ?? Math.round(atNow * 10) / 10;
    while (samples.some((s) => s.tSeconds === tSeconds))
      tSeconds = Math.round((tSeconds + 0.1) * 10) / 10;
    const next = [...samples, { tSeconds, volts }].sort((a, b) => a.tSeconds - b.tSeconds);
    setProblem(null);
    setTyped('');
    setLastStamp(
      `${formatReadingVolts(volts)} recorded at ${clockText(tSeconds)}: ${
        dueAt !== null
          ? 'the time of the prompt'
          : 'the time you pressed Record (no prompt was waiting)'
      }.`,
    );
    props.onSamples(next);
    if (volts < CAPTURE_END_VOLTS) props.onEnded(true);
    input.current?.focus();
  }

  return (
    <div className="space-y-4" data-testid="guided-capture">
      <div className="flex items-end justify-between gap-3">
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-tide-600">
            Time since isolation
          </p>
          <p
            role="timer"
            aria-label="Time since isolation"
            className="font-mono text-4xl font-bold tabular-nums text-tide-950"
            data-testid="capture-clock"
          >
            {clockText(elapsed)}
          </p>
        </div>
        {!ended ? (
          <Button variant="danger" className="min-h-12" onClick={() => props.onEnded(true)}>
            Stop the capture
          </Button>
        ) : null}
      </div>

      {!ended && !soundOn ? (
        <Button
          size="sm"
          className="min-h-10"
          onClick={() => {
            unlockCue();
            setSoundOn(true);
          }}
        >
          Turn the beep on
        </Button>
      ) : null}
      {!ended ? (
        <>
          <div
            data-testid="capture-prompt"
            data-due={dueAt !== null ? 'true' : 'false'}
            aria-live="assertive"
            className={`rounded-xl border-2 px-4 py-3 transition-colors ${
              dueAt !== null
                ? 'animate-pulse border-spark-600 bg-spark-300 text-tide-950'
                : 'border-tide-100 bg-tide-50 text-tide-900'
            }`}
          >
            {dueAt !== null ? (
              <>
                <p className="text-xl font-bold">Read the meter now</p>
                <p className="text-base">Type the voltage for {clockText(dueAt)}.</p>
              </>
            ) : (
              <>
                <p className="text-lg font-bold">Next reading at {clockText(nextAt)}</p>
                <p className="text-base">
                  in {clockText(nextAt - elapsed + 0.999)}: keep the meter in view.
                </p>
              </>
            )}
          </div>

          <form onSubmit={record} className="space-y-2" noValidate>
            <label htmlFor={inputId} className="block text-base font-bold text-tide-900">
              DC-bus voltage
            </label>
            <div className="flex gap-2">
              <div className="relative min-w-0 flex-1">
                <input
                  ref={input}
                  id={inputId}
                  className={`${inputClass} min-h-14 pr-10 text-2xl font-bold sm:text-2xl`}
                  inputMode="decimal"
                  autoComplete="off"
                  enterKeyHint="done"
                  value={typed}
                  aria-invalid={problem ? true : undefined}
                  aria-describedby={`${inputId}-stamp`}
                  onChange={(e) => setTyped(e.target.value)}
                />
                <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-xl font-bold text-tide-600">
                  V
                </span>
              </div>
              <Button
                type="submit"
                variant="primary"
                className="min-h-14 px-5 text-base"
                disabled={typed.trim() === ''}
              >
                Record reading
              </Button>
            </div>
            <p
              id={`${inputId}-stamp`}
              className="text-sm text-tide-800"
              data-testid="capture-stamp-rule"
            >
              {dueAt !== null
                ? `Goes in at ${clockText(dueAt)}, the time of the prompt.`
                : 'No prompt is waiting: a reading goes in at the time you press Record.'}
            </p>
            {problem ? (
              <p role="alert" className="text-sm font-medium text-eol-600">
                {problem}
              </p>
            ) : null}
            {lastStamp ? (
              <p role="status" className="text-sm text-tide-900" data-testid="capture-last-stamp">
                ✓ {lastStamp}
              </p>
            ) : null}
          </form>
        </>
      ) : (
        <Ended {...props} />
      )}

      <LiveVerdictLine fit={fit} />
      {fit.plotted.length > 0 ? (
        <DecayPlot samples={fit.plotted} verdict={fit.fit ? { fit: fit.fit } : null} />
      ) : null}
      <ReadingsList samples={samples} schedule={schedule} onSamples={props.onSamples} />
    </div>
  );
}

function Ended(props: GuidedCaptureProps) {
  const last = props.samples.at(-1);
  const below = last !== undefined && last.volts < CAPTURE_END_VOLTS;
  return (
    <div
      className="space-y-3 rounded-xl border-2 border-ok-600/50 bg-ok-600/5 px-4 py-3"
      data-testid="capture-ended"
    >
      <p className="text-lg font-bold text-tide-950">
        {below
          ? `The capture has ended: the last reading is below ${CAPTURE_END_VOLTS} V.`
          : 'You stopped the capture.'}
      </p>
      <p className="text-base text-tide-900">
        Before you touch anything, verify absence of voltage with the meter: test it on a known
        source, measure, test it again.
      </p>
      <BigCheck
        label={ABSENCE_CHECK.sentence}
        checked={props.absenceConfirmed}
        onChange={props.onAbsenceConfirmed}
      />
      <StepActions
        next={{ label: 'Continue to the observations', disabled: !props.absenceConfirmed, onClick: props.onFinish }}
        back={{ label: 'Take more readings', onClick: () => props.onEnded(false) }}
      />
    </div>
  );
}

/** The verdict in one line as soon as the fit can be trusted; before that, what it is waiting for. */
function LiveVerdictLine({ fit }: { fit: LiveFit }) {
  const text = verdictLine(fit);
  return (
    <div>
      <p className="mb-1 text-xs font-bold uppercase tracking-wide text-tide-600">Verdict so far</p>
      <p
        data-testid="live-verdict"
        data-trustworthy={fit.trustworthy ? 'true' : 'false'}
        aria-live="polite"
        className={`rounded-lg px-3 py-2 text-base ${fit.trustworthy ? 'border border-tide-200 bg-white text-tide-950' : 'bg-tide-50 text-tide-800'}`}
      >
        {text}
      </p>
    </div>
  );
}

function verdictLine(fit: LiveFit): string {
  if (!fit.trustworthy) return `The verdict comes with ${fit.waitingFor ?? 'more readings'}.`;
  const verdict: RecordedRunVerdict | null = fit.verdict;
  if (!verdict)
    return `τ is about ${Math.round(fit.fit!.tauSeconds)} s. The verdict comes when the bank’s figures have loaded (a connection is needed once).`;
  const text = explainVerdict(verdict, { asOfOn: todayOn() });
  // the safety finding first, then the health; the full verdict comes after the save
  return [text.safety, text.health].filter(Boolean).join(' ');
}

/** The readings so far, each correctable (a dropped digit) or removable. */
function ReadingsList({
  samples,
  schedule,
  onSamples,
}: {
  samples: readonly DecaySample[];
  schedule: readonly number[];
  onSamples: (s: DecaySample[]) => void;
}) {
  const onPrompt = useMemo(() => new Set(schedule), [schedule]);
  if (samples.length === 0) return null;
  return (
    <section aria-label="Readings" className="space-y-1">
      <h4 className="text-sm font-bold uppercase tracking-wide text-tide-600">
        Readings ({samples.length})
      </h4>
      <p className="text-xs text-tide-600">
        Mistyped one? Correct the number here; the chart follows.
      </p>
      <ol className="divide-y divide-tide-100" data-testid="capture-readings">
        {samples.map((sample, i) => (
          <ReadingRow
            key={sample.tSeconds}
            sample={sample}
            onPrompt={onPrompt.has(sample.tSeconds)}
            onChange={(volts) => onSamples(samples.map((s, j) => (j === i ? { ...s, volts } : s)))}
            onRemove={() => onSamples(samples.filter((_, j) => j !== i))}
          />
        ))}
      </ol>
    </section>
  );
}

function ReadingRow({
  sample,
  onPrompt,
  onChange,
  onRemove,
}: {
  sample: DecaySample;
  onPrompt: boolean;
  onChange: (volts: number) => void;
  onRemove: () => void;
}) {
  const [text, setText] = useState(String(sample.volts));
  const [shown, setShown] = useState(sample.volts);
  const [bad, setBad] = useState(false);
  const at = clockText(sample.tSeconds);
  // a change from elsewhere (another tab) shows here unless it is what this row already says
  if (shown !== sample.volts) {
    setShown(sample.volts);
    if (readDecimal(text) !== sample.volts) setText(String(sample.volts));
  }
  return (
    <li className="flex items-center gap-2 py-1.5" data-testid="capture-reading">
      <span className="w-14 shrink-0 font-mono text-base text-tide-950">{at}</span>
      <span className="w-20 shrink-0 text-xs text-tide-600">
        {onPrompt ? 'at the prompt' : 'typed then'}
      </span>
      <div className="relative min-w-0 flex-1">
        <input
          className={`${inputClass} pr-8`}
          inputMode="decimal"
          autoComplete="off"
          aria-label={`Reading at ${at}, volts`}
          aria-invalid={bad || undefined}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            const volts = readDecimal(e.target.value);
            const ok = volts !== null && volts >= SAMPLE_VOLTS.min && volts <= SAMPLE_VOLTS.max;
            setBad(!ok);
            if (ok && volts !== sample.volts) onChange(volts);
          }}
        />
        <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-tide-600">
          V
        </span>
      </div>
      <Button
        variant="ghost"
        size="sm"
        className="min-h-10 shrink-0"
        aria-label={`Remove the reading at ${at}`}
        onClick={onRemove}
      >
        ✕
      </Button>
    </li>
  );
}

function formatReadingVolts(volts: number): string {
  return `${String(volts)} V`;
}

// ---- the cue: a short beep and a buzz; silent where the browser does not allow sound ----

let audio: AudioContext | null = null;

/** Called from the Start press (a user gesture): browsers only let sound start from one. */
function unlockCue(): void {
  try {
    audio ??= new AudioContext();
    void audio.resume().catch(() => undefined);
  } catch {
    audio = null;
  }
}

function cue(): void {
  try {
    if (!audio && typeof AudioContext !== 'undefined') audio = new AudioContext();
    if (audio && audio.state === 'running') {
      const oscillator = audio.createOscillator();
      const gain = audio.createGain();
      oscillator.frequency.value = 880;
      gain.gain.setValueAtTime(0.25, audio.currentTime);
      gain.gain.exponentialRampToValueAtTime(0.001, audio.currentTime + 0.18);
      oscillator.connect(gain).connect(audio.destination);
      oscillator.start();
      oscillator.stop(audio.currentTime + 0.2);
    }
  } catch {
    // no sound on this phone: the card's colour is the cue
  }
  try {
    if ('vibrate' in navigator) navigator.vibrate(200);
  } catch {
    // no vibration either
  }
}

/** Keeps the screen on while the capture runs, where the browser allows it. */
function useWakeLock(active: boolean): void {
  useEffect(() => {
    if (!active || !('wakeLock' in navigator)) return;
    let lock: WakeLockSentinel | null = null;
    let gone = false;
    navigator.wakeLock
      .request('screen')
      .then((sentinel) => {
        if (gone) void sentinel.release();
        else lock = sentinel;
      })
      .catch(() => undefined);
    return () => {
      gone = true;
      void lock?.release().catch(() => undefined);
    };
  }, [active]);
}
