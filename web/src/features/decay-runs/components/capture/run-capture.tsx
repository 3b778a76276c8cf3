/** A run kept on this phone, from the choice of method to its save and verdict: the capture after the safety gate. */
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import type { BankEngineInputs, DecaySample } from '../../../../../../shared/domain';
import { judgeRecordedRun } from '../../../../../../shared/domain/recorded-run';
import {
  decayRunInputSchema,
  type DecayRunInput,
} from '../../../../../../shared/schemas/decay-run';
import { Button } from '../../../../components/ui/button';
import {
  discardDraft,
  markReady,
  updateDraft,
  type CaptureSnapshot,
  type RunDraft,
} from '../../drafts/draft-store';
import { DecayPlot } from '../decay-plot';
import { LoggerUpload } from '../logger/logger-upload';
import { RunVerdict } from '../verdict/run-verdict';
import { ABSENCE_CHECK, GuidedCapture } from './guided-capture';
import { liveFit } from './live-fit';
import { ObservationsForm, type RunObservations } from './observations-form';
import { PaperSheet } from './paper-sheet';
import { BigCheck } from './safety-gate';
import { StepActions } from './step-actions';
import { forgetStep, loadStep, saveStep, type Step, type StepState } from './capture-steps';

type Body = RunDraft['body'];

/** The top of a run's screen: the cabinet and bank, and the way back to the banks. */
export function CaptureHeader({
  title,
  onClose,
  closeLabel = '← All banks',
}: {
  title: string;
  onClose: () => void;
  closeLabel?: string;
}) {
  return (
    <div className="mb-3 flex items-center justify-between gap-2">
      <p className="text-sm font-medium text-tide-600">{title}</p>
      <Button variant="ghost" size="sm" className="min-h-10" onClick={onClose}>
        {closeLabel}
      </Button>
    </div>
  );
}

/** A problem with the run in plain words (a change the phone could not keep, a run not complete enough to save). */
export function ProblemLine({ problem }: { problem: string }) {
  return (
    <p role="alert" className="mt-3 text-sm font-medium text-eol-600">
      {problem}
    </p>
  );
}

/**
 * A run kept on this phone, from the choice of method on: the readings (guided capture, a paper
 * sheet or a logger file), the observations, the save and the verdict. It needs only the draft
 * and the facts of its visit and bank, so it opens from the visit's page or, without a
 * connection, from the facts kept with the draft.
 */
export function RunCapture({
  facts,
  initialDraft,
  drafts,
  onClose,
  closeLabel,
  photos,
}: {
  /** The visit's and bank's facts, and the engine's inputs (null when not at hand). */
  facts: CaptureSnapshot;
  initialDraft: RunDraft;
  /** The drafts on this phone, live (the run's status follows them). */
  drafts: readonly RunDraft[];
  onClose: () => void;
  closeLabel?: string;
  /** The visit's photos before and after the save; none without a connection. */
  photos?: { finish: ReactNode; saved: ReactNode };
}) {
  const { engine } = facts;
  const [body, setBody] = useState<Body>(initialDraft.body);
  const [stepState, setStepState] = useState<StepState>(() => loadStep(initialDraft));
  const [problem, setProblem] = useState<string | null>(null);
  const [openedAt] = useState(() => new Date().toISOString());
  const draft = drafts.find((d) => d.clientId === body.clientId) ?? initialDraft;
  const samples = useMemo(() => (body.samples ?? []) as DecaySample[], [body.samples]);
  // each step starts at the top of the screen, below the visit's header and cautions
  const top = useRef<HTMLDivElement>(null);
  const where = `run:${stepState.step}:${draft.status}`;
  useEffect(() => {
    top.current?.scrollIntoView({ block: 'start' });
  }, [where]);

  const clientId = body.clientId;
  function patch(change: Partial<Body>) {
    setBody((current) => ({ ...current, ...change }));
    updateDraft(clientId, change).catch((error: unknown) =>
      setProblem(error instanceof Error ? error.message : String(error)),
    );
  }
  function go(next: Partial<StepState>) {
    setStepState((current) => {
      const state = { ...current, ...next };
      saveStep(clientId, state);
      return state;
    });
  }

  const status = draft.status;
  const gateAt = (body.safety as { confirmedAt?: string } | undefined)?.confirmedAt ?? openedAt;
  const absence =
    (body.safety as { absenceOfVoltageVerified?: boolean } | undefined)
      ?.absenceOfVoltageVerified === true;
  const setAbsence = (on: boolean) => {
    const safety = {
      ...(body.safety ?? {}),
      absenceOfVoltageVerified: on ? true : undefined,
    } as unknown as DecayRunInput['safety'];
    patch({ safety });
  };

  let content;
  if (status !== 'capturing') {
    content = (
      <SavedRun
        facts={facts}
        draft={draft}
        body={body}
        engine={engine}
        photos={photos?.saved}
        onClose={onClose}
      />
    );
  } else if (stepState.step === 'method') {
    content = (
      <ChooseMethod
        bankPosition={facts.bankPosition}
        onChoose={(step) => {
          if (step === 'typed') patch({ source: 'typed', isolatedAt: body.isolatedAt ?? gateAt });
          if (step === 'guided') patch({ source: 'guided' });
          go({ step });
        }}
        onDiscard={async () => {
          await discardDraft(body.clientId);
          onClose();
        }}
      />
    );
  } else if (stepState.step === 'guided') {
    content = (
      <GuidedCapture
        expectedTauSeconds={facts.expectedTauSeconds}
        engine={engine}
        isolatedAt={body.isolatedAt}
        samples={samples}
        ended={stepState.ended}
        absenceConfirmed={absence}
        onStart={(isolatedAt) => patch({ isolatedAt, source: 'guided' })}
        onSamples={(next) => patch({ samples: next })}
        onEnded={(ended) => go({ ended })}
        onAbsenceConfirmed={setAbsence}
        onFinish={() => go({ step: 'finish' })}
      />
    );
  } else if (stepState.step === 'typed') {
    content = (
      <PaperSheet
        engine={engine}
        samples={samples}
        isolatedAt={body.isolatedAt ?? gateAt}
        onSamples={(next) => patch({ samples: next })}
        onIsolatedAt={(isolatedAt) => patch({ isolatedAt })}
        onDone={() => go({ step: 'finish' })}
      />
    );
  } else if (stepState.step === 'logger') {
    content = engine ? (
      <LoggerUpload
        engine={engine}
        onUse={(read, file) => {
          patch({
            source: 'logger',
            loggerFileName: file.fileName,
            samples: read,
            isolatedAt: body.isolatedAt ?? gateAt,
          });
          go({ step: 'finish' });
        }}
      />
    ) : (
      <p className="text-base text-tide-900">
        A logger file is read by Ebbline’s server: it needs a connection. Choose another way, or try
        again when connected.
      </p>
    );
  } else {
    content = (
      <Finish
        body={body}
        engine={engine}
        photos={photos?.finish}
        absence={absence}
        askAbsence={body.source !== 'guided' || !absence}
        onAbsence={setAbsence}
        onObservations={(observations) => patch({ observations })}
        onBack={() =>
          go({
            step:
              body.source === 'logger' ? 'logger' : body.source === 'typed' ? 'typed' : 'guided',
          })
        }
        onSave={async () => {
          const final = {
            ...body,
            isolatedAt: body.isolatedAt ?? gateAt,
            observations: { visualFindings: [], ...(body.observations ?? {}) },
          };
          const parsed = decayRunInputSchema.safeParse(final);
          if (!parsed.success) {
            setProblem(
              `This run cannot be saved yet: ${parsed.error.issues.map((i) => i.message).join(' ')}`,
            );
            return;
          }
          setProblem(null);
          await updateDraft(body.clientId, final);
          await markReady(body.clientId);
        }}
      />
    );
  }

  return (
    <div data-testid="bank-capture" ref={top} className="scroll-mt-20">
      <CaptureHeader
        title={`${facts.cabinetTag} · ${facts.bankPosition}`}
        onClose={onClose}
        closeLabel={closeLabel}
      />
      {status === 'capturing' && stepState.step !== 'method' ? (
        <h3 className="mb-3 text-lg font-bold text-tide-900">
          {stepState.step === 'guided'
            ? 'Guided capture'
            : stepState.step === 'typed'
              ? 'Readings from a paper sheet'
              : stepState.step === 'logger'
                ? 'Readings from a logger file'
                : 'Observations and save'}
        </h3>
      ) : null}
      {content}
      {problem ? <ProblemLine problem={problem} /> : null}
    </div>
  );
}

function ChooseMethod({
  bankPosition,
  onChoose,
  onDiscard,
}: {
  bankPosition: string;
  onChoose: (step: Step) => void;
  onDiscard: () => Promise<void>;
}) {
  const [discarding, setDiscarding] = useState(false);
  return (
    <div className="space-y-3" data-testid="choose-method">
      <h3 className="text-lg font-bold text-tide-900">
        How do you take the readings of {bankPosition}?
      </h3>
      <MethodButton
        title="Guided capture now"
        text="Press Start at isolation; the phone tells you when to read the meter."
        onClick={() => onChoose('guided')}
        primary
      />
      <MethodButton
        title="Type readings from a paper sheet"
        text="You wrote the times and voltages down as you measured."
        onClick={() => onChoose('typed')}
      />
      <MethodButton
        title="Read a logger file"
        text="A CSV from a data logger or an oscilloscope."
        onClick={() => onChoose('logger')}
      />
      {discarding ? (
        <div className="space-y-2 rounded-lg bg-tide-50 p-3">
          <p className="text-sm text-tide-900">
            Throw this run away? The safety confirmation is forgotten; nothing was sent.
          </p>
          <div className="flex gap-2">
            <Button variant="danger" onClick={() => void onDiscard()}>
              Yes, throw it away
            </Button>
            <Button onClick={() => setDiscarding(false)}>Keep it</Button>
          </div>
        </div>
      ) : (
        <Button variant="ghost" size="sm" onClick={() => setDiscarding(true)}>
          Throw this run away
        </Button>
      )}
    </div>
  );
}

function MethodButton({
  title,
  text,
  onClick,
  primary = false,
}: {
  title: string;
  text: string;
  onClick: () => void;
  primary?: boolean;
}) {
  return (
    <button
      type="button"
      onClick={onClick}
      aria-describedby={undefined}
      className={`block min-h-16 w-full rounded-xl border-2 px-4 py-3 text-left ${primary ? 'border-tide-800 bg-tide-800 text-white' : 'border-tide-200 bg-white text-tide-900 hover:bg-tide-50'}`}
    >
      <span className="block text-lg font-bold">{title}</span>
      <span className={`block text-sm ${primary ? 'text-tide-50' : 'text-tide-600'}`}>{text}</span>
    </button>
  );
}

function Finish({
  body,
  engine,
  photos,
  absence,
  askAbsence,
  onAbsence,
  onObservations,
  onBack,
  onSave,
}: {
  body: Body;
  engine: BankEngineInputs | null;
  /** The visit's photos; none without a connection. */
  photos: ReactNode | undefined;
  absence: boolean;
  askAbsence: boolean;
  onAbsence: (on: boolean) => void;
  onObservations: (observations: RunObservations) => void;
  onBack: () => void;
  onSave: () => Promise<void>;
}) {
  const [problems, setProblems] = useState<string[]>([]);
  const [saving, setSaving] = useState(false);
  const samples = useMemo(() => (body.samples ?? []) as DecaySample[], [body.samples]);
  const observations = body.observations as RunObservations | undefined;
  const fit = useMemo(
    () => liveFit(samples, engine, observations ?? {}),
    [samples, engine, observations],
  );
  return (
    <div className="space-y-5" data-testid="capture-finish">
      {askAbsence ? (
        <div className="space-y-2">
          <p className="text-base text-tide-900">
            Before you touch anything, verify absence of voltage with the meter: test it on a known
            source, measure, test it again.
          </p>
          <BigCheck label={ABSENCE_CHECK.sentence} checked={absence} onChange={onAbsence} />
        </div>
      ) : null}
      <ObservationsForm
        initial={observations}
        designBleederOhms={engine?.design.bleederOhms}
        onChange={(next, nextProblems) => {
          setProblems(nextProblems);
          onObservations(next);
        }}
      />
      {photos ? (
        <div className="space-y-2">
          <h4 className="text-base font-bold text-tide-900">Photos (optional)</h4>
          {photos}
        </div>
      ) : null}
      {fit.verdict?.safetyFinding ? (
        <p className="text-sm font-medium text-eol-600">
          This run carries a safety finding: it is saved as such.
        </p>
      ) : null}
      <p className="text-sm text-tide-800">
        {samples.length} reading{samples.length === 1 ? '' : 's'}. Saving keeps the run on this
        phone and sends it as soon as there is a connection.
      </p>
      {problems.length ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          {problems.join(' ')}
        </p>
      ) : null}
      <StepActions
        next={{
          label: saving ? 'Saving…' : 'Save the run',
          disabled: !absence || saving || problems.length > 0,
          onClick: () => {
            setSaving(true);
            onSave().finally(() => setSaving(false));
          },
        }}
        back={{ label: 'Back to the readings', onClick: onBack }}
      />
      {!absence ? <p className="text-sm text-tide-800">Confirm absence of voltage first.</p> : null}
    </div>
  );
}

/** After Save: where the run is (on this phone, sending, sent, refused) and its verdict. */
function SavedRun({
  facts,
  draft,
  body,
  engine,
  photos,
  onClose,
}: {
  facts: CaptureSnapshot;
  draft: RunDraft;
  body: Body;
  engine: BankEngineInputs | null;
  /** The visit's photos; none without a connection. */
  photos: ReactNode | undefined;
  onClose: () => void;
}) {
  const samples = useMemo(() => (body.samples ?? []) as DecaySample[], [body.samples]);
  const local = useMemo(
    () =>
      engine && samples.length
        ? judgeRecordedRun({
            samples,
            engine,
            observations: (body.observations ?? {}) as RunObservations,
          })
        : null,
    [engine, samples, body.observations],
  );
  const verdict = draft.run?.verdict ?? local;
  // once the server has the run, where its capture stood is of no more use on this phone
  useEffect(() => {
    if (draft.status === 'sent') forgetStep(draft.clientId);
  }, [draft.status, draft.clientId]);
  const fit = verdict?.status === 'ok' ? verdict.fit : null;
  const plotted = useMemo(() => liveFit(samples, null).plotted, [samples]);
  return (
    <div className="space-y-4" data-testid="saved-run">
      <p
        role="status"
        data-testid="saved-run-status"
        data-status={draft.status}
        className={`rounded-lg px-3 py-2 text-base font-medium ${draft.status === 'refused' ? 'border border-eol-600/40 bg-eol-600/5 text-eol-600' : 'bg-ok-600/10 text-tide-950'}`}
      >
        {draft.status === 'sent'
          ? '✓ Sent: the run is stored in Ebbline for review.'
          : draft.status === 'refused'
            ? `The server refused this run: ${draft.refusal ?? 'no reason given'} The readings stay on this phone.`
            : '✓ Saved on this phone. It is sent by itself as soon as there is a connection.'}
      </p>
      <h3 className="text-lg font-bold text-tide-900">Verdict for {facts.bankPosition}</h3>
      {verdict ? (
        <RunVerdict
          verdict={verdict}
          context={{
            markedWaitSeconds: facts.markedWaitMinutes ? facts.markedWaitMinutes * 60 : null,
          }}
        />
      ) : (
        <p className="text-base text-tide-900">
          The verdict shows once the bank’s figures have loaded (a connection is needed).
        </p>
      )}
      {plotted.length ? <DecayPlot samples={plotted} verdict={fit ? { fit } : null} /> : null}
      {photos}
      <Button variant="primary" className="min-h-12 w-full text-base sm:w-auto" onClick={onClose}>
        Back to the banks
      </Button>
    </div>
  );
}
