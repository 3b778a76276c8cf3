import { useMemo, useRef, useState, type FormEvent } from 'react';
import type { DecayRun, DecayRunCorrectionInput } from '../../../../../../shared/schemas/decay-run';
import { DECAY_RUN_TEXT_LIMITS } from '../../../../../../shared/constants/decay-runs';
import { Button } from '../../../../components/ui/button';
import { Field, TextArea } from '../../../../components/ui/field';
import { ApiError } from '../../../../lib/api-client';
import { useCorrectDecayRun } from '../../api/correct-decay-run';
import {
  EMPTY_READING_ROW,
  readReadingRows,
  withCell,
  withoutRow,
  type ReadingRow,
} from '../../utils/readings';
import { ObservationsForm, type RunObservations } from '../capture/observations-form';
import { DecayPlot } from '../decay-plot';
import { ReadingsTable } from '../readings-table';

const NO_MARKS = new Map();

type CorrectionBody = Omit<DecayRunCorrectionInput, 'clientId'>;

/**
 * The clientId of a correction: the same for the same body (a retry after a lost answer stores
 * one version), a new one once the body has changed (a different correction).
 */
function useClientIdFor() {
  const last = useRef<{ key: string; clientId: string } | null>(null);
  return (body: CorrectionBody): string => {
    const key = JSON.stringify(body);
    if (last.current?.key !== key) last.current = { key, clientId: crypto.randomUUID() };
    return last.current.clientId;
  };
}

function rowsOf(run: DecayRun): ReadingRow[] {
  return [
    ...run.samples.map((s) => ({ time: String(s.tSeconds), volts: String(s.volts) })),
    EMPTY_READING_ROW,
  ];
}

/**
 * A correction of a stored run: the readings (the readings table, to fix a mistyped reading or
 * remove one) and the observations to edit, and the reason, which is required. It is stored as
 * the run's next version; the run as recorded stays, and both are shown. Idempotent: a retry of
 * the same correction sends the same clientId, so one version is stored.
 *
 * @param onCorrected - gets the new version once stored
 */
export function CorrectionForm({
  run,
  onCorrected,
  onCancel,
}: {
  run: DecayRun;
  onCorrected?: (next: DecayRun) => void;
  onCancel?: () => void;
}) {
  const [rows, setRows] = useState<ReadingRow[]>(() => rowsOf(run));
  const [observations, setObservations] = useState<RunObservations>(() => ({
    ...run.observations,
    visualFindings: [...run.observations.visualFindings],
  }));
  const [observationProblems, setObservationProblems] = useState<string[]>([]);
  const [reason, setReason] = useState('');
  const [tried, setTried] = useState(false);
  const clientIdFor = useClientIdFor();
  const correct = useCorrectDecayRun();
  const readings = useMemo(() => readReadingRows(rows), [rows]);

  const reasonProblem =
    reason.trim() === ''
      ? 'Say why the run is corrected: the reviewer and the bank history read it.'
      : undefined;
  const readingsProblem =
    readings.issues.length > 0
      ? 'Fix or remove the rows with a problem.'
      : readings.samples.length === 0
        ? 'Keep at least one reading.'
        : undefined;
  const blocked = reasonProblem ?? readingsProblem ?? observationProblems[0];

  function setCell(index: number, field: keyof ReadingRow, value: string) {
    setRows((current) => withCell(current, index, field, value));
  }

  function removeRow(index: number) {
    setRows((current) => withoutRow(current, index));
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    setTried(true);
    if (blocked) return;
    const body: CorrectionBody = {
      source: run.source,
      ...(run.loggerFileName ? { loggerFileName: run.loggerFileName } : {}),
      isolatedAt: run.isolatedAt,
      samples: readings.samples,
      // the checks were confirmed at the cabinet; a correction of the record does not repeat them
      safety: run.safety,
      observations,
      reason: reason.trim(),
    };
    // the promise, not mutate's callbacks: the old version's refetch (now corrected) may unmount
    // this form before they would run, and the new version must still open
    correct
      .mutateAsync({ runId: run.id, correction: { clientId: clientIdFor(body), ...body } })
      .then(
        (next) => onCorrected?.(next),
        () => undefined, // shown from correct.error
      );
  }

  const error = correct.error;
  return (
    <form className="space-y-5" onSubmit={submit} noValidate data-testid="correction-form">
      <p className="text-sm text-tide-800">
        A stored run is never changed. Your correction becomes <b>version {run.version + 1}</b>, and
        version {run.version} stays readable beside it.
      </p>
      <Field
        id="correction-reason"
        label="Why is this run corrected?"
        required
        hint="For example: the reading at 2 min was typed as 412 V; the sheet says 421 V."
        error={tried ? reasonProblem : undefined}
      >
        <TextArea
          id="correction-reason"
          rows={3}
          maxLength={DECAY_RUN_TEXT_LIMITS.correctionReason}
          invalid={tried && !!reasonProblem}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
        />
      </Field>

      <section className="space-y-3">
        <ReadingsTable
          rows={rows}
          issues={readings.issues}
          leftOut={NO_MARKS}
          onCell={setCell}
          onRemove={removeRow}
        />
        {tried && readingsProblem ? (
          <p className="text-sm font-medium text-eol-600">{readingsProblem}</p>
        ) : null}
        {readings.samples.length > 1 ? (
          <DecayPlot samples={readings.samples} verdict={null} />
        ) : null}
      </section>

      <ObservationsForm
        initial={observations}
        onChange={(next, problems) => {
          setObservations(next);
          setObservationProblems(problems);
        }}
      />

      {error ? (
        <div
          role="alert"
          className="rounded-lg border border-eol-600/40 bg-eol-600/5 px-3 py-2 text-sm text-tide-950"
          data-testid="correction-error"
        >
          <b className="text-eol-600">The correction was not stored.</b> {error.message}
          {error instanceof ApiError && error.issues.length > 0 ? (
            <ul className="mt-1 list-disc pl-5">
              {error.issues.map((issue) => (
                <li key={issue.path + issue.message}>{issue.message}</li>
              ))}
            </ul>
          ) : null}
          {error instanceof ApiError && (error.status === 0 || error.status >= 500) ? (
            <p className="mt-1">Try again: the same correction is sent, so it is stored once.</p>
          ) : null}
        </div>
      ) : null}

      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" className="min-h-12" disabled={correct.isPending}>
          {correct.isPending ? 'Storing the correction…' : `Store as version ${run.version + 1}`}
        </Button>
        {onCancel ? (
          <Button className="min-h-12" onClick={onCancel} disabled={correct.isPending}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
