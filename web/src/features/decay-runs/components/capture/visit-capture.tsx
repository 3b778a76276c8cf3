import { useQueries } from '@tanstack/react-query';
import { useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { HEALTH_LABELS } from '../../../../../../shared/constants/health';
import { REVIEW_STATE_LABELS } from '../../../../../../shared/constants/decay-runs';
import type { Role } from '../../../../../../shared/constants/roles';
import type { BankEngineInputs, DecaySample } from '../../../../../../shared/domain';
import { judgeRecordedRun } from '../../../../../../shared/domain/recorded-run';
import {
  decayRunInputSchema,
  type DecayRun,
  type DecayRunInput,
} from '../../../../../../shared/schemas/decay-run';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import { Badge } from '../../../../components/ui/badge';
import { Button } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { captureBankQueryOptions, useCaptureEngine } from '../../api/get-capture-bank';
import { useVisitDecayRuns } from '../../api/get-decay-runs';
import {
  createDraft,
  discardDraft,
  markReady,
  updateDraft,
  useVisitDrafts,
  type CaptureSnapshot,
  type RunDraft,
} from '../../drafts/draft-store';
import { DecayPlot } from '../decay-plot';
import { LoggerUpload } from '../logger/logger-upload';
import { VisitPhotos } from '../photos/visit-photos';
import { RunVerdict } from '../verdict/run-verdict';
import { VisitRuns } from '../verdict/visit-runs';
import { captureSnapshotOf } from './capture-facts';
import { ABSENCE_CHECK, GuidedCapture } from './guided-capture';
import { liveFit } from './live-fit';
import { ObservationsForm, type RunObservations } from './observations-form';
import { PaperSheet } from './paper-sheet';
import { BigCheck, SafetyGate, type GateConfirmation } from './safety-gate';
import { StepActions } from './step-actions';

/** Who is looking at the visit. */
export interface CaptureViewer {
  id: string;
  roles: readonly Role[];
}

/** Where a run in progress is, kept on this phone beside its draft so a reload resumes there. */
type Step = 'method' | 'guided' | 'typed' | 'logger' | 'finish';

interface StepState {
  step: Step;
  /** The guided capture has ended (a reading below 50 V, or Stop). */
  ended: boolean;
}

const STEP_KEY = (clientId: string) => `ebbline-capture-step:${clientId}`;

function loadStep(draft: RunDraft): StepState {
  try {
    const stored = JSON.parse(
      localStorage.getItem(STEP_KEY(draft.clientId)) ?? 'null',
    ) as StepState | null;
    if (stored && typeof stored.step === 'string') return stored;
  } catch {
    // nothing kept: work it out from the draft
  }
  const source = draft.body.source;
  if (draft.body.samples?.length || (source === 'guided' && draft.body.isolatedAt))
    return { step: source ?? 'guided', ended: false };
  return { step: 'method', ended: false };
}

function forgetStep(clientId: string): void {
  try {
    localStorage.removeItem(STEP_KEY(clientId));
  } catch {
    // nothing kept
  }
}

function saveStep(clientId: string, state: StepState): void {
  try {
    localStorage.setItem(STEP_KEY(clientId), JSON.stringify(state));
  } catch {
    // private mode: the step is worked out from the draft after a reload
  }
}

/** The run a bank has on this visit: its newest current stored run, and this phone's drafts. */
interface BankState {
  bank: VisitBankRef;
  run: DecayRun | undefined;
  /** The newest draft not yet sent (capturing, ready, sending or refused). */
  draft: RunDraft | undefined;
}

function bankStates(
  visit: Visit,
  drafts: readonly RunDraft[],
  runs: readonly DecayRun[] | undefined,
): BankState[] {
  return visit.banks.map((bank) => {
    const current = (runs ?? []).filter((r) => r.bankId === bank.id && r.supersededById === null);
    const sentIds = new Set((runs ?? []).map((r) => r.clientId));
    const unsent = drafts.filter(
      (d) => d.bankId === bank.id && d.status !== 'sent' && !sentIds.has(d.clientId),
    );
    return {
      bank,
      run: current.sort((a, b) => b.recordedAt.localeCompare(a.recordedAt))[0],
      draft: unsent.at(-1),
    };
  });
}

/**
 * The work at the cabinet for one visit: each bank with its state (not measured, in progress
 * on this phone, saved and waiting to be sent, sent with its health, queried with the
 * reviewer's comment), and per bank the safety gate, the readings (guided capture, a paper
 * sheet or a logger file), the observations, the save and the verdict. A run in progress is a
 * draft on this phone from the safety confirmation on: after a reload it opens where it was.
 */
export function VisitCapture({ visit, viewer }: { visit: Visit; viewer: CaptureViewer }) {
  const drafts = useVisitDrafts(visit.id);
  const runs = useVisitDecayRuns(visit.id);
  const states = bankStates(visit, drafts, runs.data);
  // undefined until the technician opens or closes a bank: a run in progress on this phone
  // then opens where it was (after a reload or a closed tab)
  const [chosen, setChosen] = useState<{ bankId: string; clientId?: string } | null | undefined>(
    undefined,
  );
  const headingId = useId();
  // the bank's figures for the live verdict, loaded while the connection is there
  useQueries({ queries: visit.banks.map((bank) => captureBankQueryOptions(bank.id)) });
  const capturing = drafts
    .filter((d) => d.status === 'capturing' && visit.banks.some((b) => b.id === d.bankId))
    .at(-1);
  // once opened so, it stays open past its save (the verdict comes next)
  if (chosen === undefined && capturing)
    setChosen({ bankId: capturing.bankId, clientId: capturing.clientId });
  const open = chosen ?? null;
  const setOpen = setChosen;

  const openState = open ? states.find((s) => s.bank.id === open.bankId) : undefined;
  const openDraft = open?.clientId ? drafts.find((d) => d.clientId === open.clientId) : undefined;

  return (
    <section aria-labelledby={headingId} className="space-y-4" data-testid="visit-capture">
      <h2 id={headingId} className="text-xl font-bold text-tide-900">
        At the cabinet
      </h2>
      {openState ? (
        <Card>
          {open?.clientId && !openDraft ? (
            <p className="text-sm text-tide-800">Opening the run kept on this phone…</p>
          ) : (
            <BankCapture
              key={open!.bankId}
              visit={visit}
              viewer={viewer}
              bank={openState.bank}
              initialDraft={openDraft}
              drafts={drafts}
              onClose={() => setOpen(null)}
            />
          )}
        </Card>
      ) : (
        <Card
          title={
            visit.banks.length === 1
              ? 'The bank to measure'
              : `The ${visit.banks.length} banks to measure`
          }
        >
          <ul className="divide-y divide-tide-100" data-testid="capture-banks">
            {states.map((state) => (
              <BankRow
                key={state.bank.id}
                state={state}
                onMeasure={() =>
                  setOpen({
                    bankId: state.bank.id,
                    clientId:
                      state.draft?.status === 'capturing' ? state.draft.clientId : undefined,
                  })
                }
                onOpenDraft={() =>
                  state.draft && setOpen({ bankId: state.bank.id, clientId: state.draft.clientId })
                }
              />
            ))}
          </ul>
        </Card>
      )}
      {!openState ? <VisitRuns visitId={visit.id} viewer={viewer} /> : null}
    </section>
  );
}

function BankRow({
  state,
  onMeasure,
  onOpenDraft,
}: {
  state: BankState;
  onMeasure: () => void;
  onOpenDraft: () => void;
}) {
  const { bank, run, draft } = state;
  const position = bank.position;
  return (
    <li className="space-y-2 py-3" data-testid={`capture-bank-${position}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block text-lg font-bold text-tide-900">{position}</span>
          <span className="block text-sm text-tide-600">{bank.bankDesignCode}</span>
        </span>
        <BankStateBadge state={state} />
      </div>
      {draft?.status === 'refused' ? (
        <p className="rounded-lg border border-eol-600/40 bg-eol-600/5 px-3 py-2 text-sm text-tide-950">
          The server refused the run saved on this phone: {draft.refusal ?? 'no reason given'}. The
          readings are kept here.
        </p>
      ) : null}
      {run?.review.state === 'queried' ? (
        <p
          className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950"
          data-testid={`queried-${position}`}
        >
          <b>Queried{run.review.reviewedBy ? ` by ${run.review.reviewedBy.name}` : ''}:</b> “
          {run.review.comment}”
        </p>
      ) : null}
      {draft?.status === 'capturing' ? (
        <Button variant="primary" className="min-h-12 w-full text-base" onClick={onMeasure}>
          Go on with {position}
        </Button>
      ) : draft &&
        (draft.status === 'ready' || draft.status === 'sending' || draft.status === 'refused') ? (
        <Button className="min-h-12 w-full text-base" onClick={onOpenDraft}>
          Open the run of {position}
        </Button>
      ) : (
        <Button
          variant={run ? 'secondary' : 'primary'}
          className="min-h-12 w-full text-base"
          onClick={onMeasure}
        >
          {run ? `Measure bank ${position} again` : `Measure bank ${position}`}
        </Button>
      )}
    </li>
  );
}

function BankStateBadge({ state }: { state: BankState }) {
  const { run, draft } = state;
  if (draft?.status === 'capturing') return <Badge tone="spark">in progress on this phone</Badge>;
  if (draft?.status === 'ready' || draft?.status === 'sending')
    return <Badge tone="warn">saved on this phone, not sent yet</Badge>;
  if (draft?.status === 'refused') return <Badge tone="danger">refused: kept on this phone</Badge>;
  if (!run) return <Badge tone="muted">not measured</Badge>;
  const health = run.health ? HEALTH_LABELS[run.health] : 'not judged';
  const tone =
    run.safetyFinding || run.health === 'end-of-life'
      ? 'danger'
      : run.health === 'watch'
        ? 'warn'
        : run.health === 'healthy'
          ? 'ok'
          : 'muted';
  return (
    <span className="flex flex-wrap gap-1">
      <Badge tone={tone}>sent: {health}</Badge>
      <Badge tone={run.review.state === 'queried' ? 'warn' : 'muted'}>
        {REVIEW_STATE_LABELS[run.review.state]}
      </Badge>
    </span>
  );
}

type Body = RunDraft['body'];

/** One bank's run: the safety gate for a new run, then the run's capture ({@link RunCapture}). */
function BankCapture({
  visit,
  viewer,
  bank,
  initialDraft,
  drafts,
  onClose,
}: {
  visit: Visit;
  viewer: CaptureViewer;
  bank: VisitBankRef;
  /** The run in progress to resume; none for a new run (the safety gate first). */
  initialDraft: RunDraft | undefined;
  /** The visit's drafts on this phone, live (the run's status follows them). */
  drafts: readonly RunDraft[];
  onClose: () => void;
}) {
  const { engine, bank: bankRecord } = useCaptureEngine(bank.id);
  const busVolts = bankRecord?.cabinetDcBusVolts ?? undefined;
  const [started, setStarted] = useState<RunDraft | undefined>(initialDraft);
  const [problem, setProblem] = useState<string | null>(null);
  const [creating, setCreating] = useState(false);
  const top = useRef<HTMLDivElement>(null);
  useEffect(() => {
    top.current?.scrollIntoView({ block: 'start' });
  }, []);

  async function confirmGate(confirmation: GateConfirmation) {
    setCreating(true);
    try {
      const created = await createDraft({
        visitId: visit.id,
        bankId: bank.id,
        source: 'guided',
        snapshot: captureSnapshotOf(visit, bank, engine),
      });
      // absence of voltage is confirmed at the end; until then the draft keeps the gate's four
      const safety = confirmation as unknown as DecayRunInput['safety'];
      const updated = await updateDraft(created.clientId, { safety });
      saveStep(created.clientId, { step: 'method', ended: false });
      setStarted(updated);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : String(error));
    } finally {
      setCreating(false);
    }
  }

  if (!started) {
    return (
      <div data-testid="bank-capture" ref={top} className="scroll-mt-20">
        <CaptureHeader title={`${visit.cabinetTag} · ${bank.position}`} onClose={onClose} />
        <SafetyGate
          visit={visit}
          bank={bank}
          busVolts={busVolts}
          onConfirm={(c) => void confirmGate(c)}
          onCancel={onClose}
        />
        {creating ? (
          <p className="mt-2 text-sm text-tide-800">Keeping the run on this phone…</p>
        ) : null}
        {problem ? <ProblemLine problem={problem} /> : null}
      </div>
    );
  }
  const technician = visit.technicians.some((t) => t.id === viewer.id);
  return (
    <RunCapture
      // the bank's figures as loaded now; those kept with the run when they cannot be loaded
      facts={captureSnapshotOf(visit, bank, engine ?? started.snapshot?.engine ?? null)}
      initialDraft={started}
      drafts={drafts}
      onClose={onClose}
      photos={{
        finish: (
          <VisitPhotos
            visitId={visit.id}
            bankId={bank.id}
            canAdd={technician || viewer.roles.includes('admin')}
          />
        ),
        saved: <VisitPhotos visitId={visit.id} bankId={bank.id} canAdd={technician} />,
      }}
    />
  );
}

function CaptureHeader({
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

function ProblemLine({ problem }: { problem: string }) {
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

/**
 * In the "Mark as logged" confirmation: "Are you sure?" with the banks of the visit that have no
 * run sent yet (and those still waiting on this phone); nothing when every bank has one.
 */
export function UnsentRunsWarning({ visit }: { visit: Visit }) {
  const drafts = useVisitDrafts(visit.id);
  const runs = useVisitDecayRuns(visit.id);
  const states = bankStates(visit, drafts, runs.data);
  const missing = states.filter((s) => !s.run);
  if (missing.length === 0) return null;
  const waiting = missing.filter((s) => s.draft && s.draft.status !== 'capturing');
  const none = missing.filter((s) => !s.draft || s.draft.status === 'capturing');
  const names = (list: BankState[]) => list.map((s) => s.bank.position).join(', ');
  return (
    <div
      role="alert"
      className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950"
      data-testid="unsent-runs-warning"
    >
      <p className="font-bold">Are you sure?</p>
      {none.length ? (
        <p>
          No decay run has been sent for {names(none)}. A logged visit goes to review without
          {none.length === 1 ? ' it' : ' them'}.
        </p>
      ) : null}
      {waiting.length ? (
        <p>
          The {waiting.length === 1 ? 'run' : 'runs'} of {names(waiting)}{' '}
          {waiting.length === 1 ? 'is' : 'are'} saved on this phone but not sent yet: they are sent
          when the phone is online.
        </p>
      ) : null}
    </div>
  );
}
