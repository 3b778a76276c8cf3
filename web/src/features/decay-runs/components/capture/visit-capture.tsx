import { useQueries } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState } from 'react';
import type { Role } from '../../../../../../shared/constants/roles';
import type { DecayRunInput } from '../../../../../../shared/schemas/decay-run';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import { Card } from '../../../../components/ui/card';
import { captureBankQueryOptions, useCaptureEngine } from '../../api/get-capture-bank';
import { useVisitDecayRuns } from '../../api/get-decay-runs';
import { createDraft, updateDraft, useVisitDrafts, type RunDraft } from '../../drafts/draft-store';
import { VisitPhotos } from '../photos/visit-photos';
import { VisitRuns } from '../verdict/visit-runs';
import { captureSnapshotOf } from './capture-facts';
import { SafetyGate, type GateConfirmation } from './safety-gate';
import { bankStates, BankRow, type BankState } from './bank-list';
import { saveStep } from './capture-steps';
import { CaptureHeader, ProblemLine, RunCapture } from './run-capture';

/** Who is looking at the visit. */
export interface CaptureViewer {
  id: string;
  roles: readonly Role[];
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
