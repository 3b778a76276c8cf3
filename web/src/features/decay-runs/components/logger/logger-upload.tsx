import { useId, useMemo, useState } from 'react';
import { LOGGER_FILE_MAX_BYTES, LOGGER_FILE_MAX_MEBIBYTES } from '../../../../../../shared/constants/logger-files';
import { formatPercentFigure, type BankEngineInputs, type DecaySample } from '../../../../../../shared/domain';
import { judgeRecordedRun, type RecordedRunVerdict } from '../../../../../../shared/domain/recorded-run';
import type { LoggerColumnCandidates, LoggerFilePreview } from '../../../../../../shared/schemas/logger-file';
import { Button, buttonClass } from '../../../../components/ui/button';
import { DischargeCaution } from '../../../../components/ui/discharge-caution';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { Field, Select } from '../../../../components/ui/field';
import { ProgressBar } from '../../../../components/ui/progress-bar';
import { ApiError } from '../../../../lib/api-client';
import { columnCandidatesOf, usePreviewLoggerFile, type LoggerFileUpload } from '../../api/preview-logger-file';
import { seconds } from '../../utils/figures';
import { leftOutRows } from '../../utils/left-out-rows';
import { DecayPlot } from '../decay-plot';

/** Props of {@link LoggerUpload}. */
export interface LoggerUploadProps {
  /** The bank's design, baseline and cabinet, to judge the file's readings with (bankEngineInputs). */
  engine: BankEngineInputs;
  /** The person chose to use the file's readings: the samples as read, and the file's name. */
  onUse: (samples: DecaySample[], file: { fileName: string }) => void;
}

/** File types a logger or scope exports as text; any name is read by its content on the server. */
const ACCEPT = '.csv,.txt,.tsv,.dat,.asc,text/csv,text/plain,text/tab-separated-values';

/** Checks in the browser what the server checks too, so a wrong file is named before it is sent. */
function loggerFileProblem(file: File): string | null {
  if (file.size === 0) return `${file.name} is empty. Choose the logger's export of the discharge.`;
  if (file.size > LOGGER_FILE_MAX_BYTES) {
    return `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${LOGGER_FILE_MAX_MEBIBYTES} MB. Export the readings at a coarser sampling interval, or only the discharge, and choose that file.`;
  }
  return null;
}

/** The title of a refusal, by its code, in plain words; the server's message follows it. */
function refusalTitle(error: Error): string {
  if (!(error instanceof ApiError)) return 'The file could not be read';
  switch (error.code) {
    case 'file-too-large':
      return 'The file is too large';
    case 'not-a-text-file':
      return "This is not a logger's text export";
    case 'unreadable-file':
      return 'The file could not be read as a decay run';
    case 'forbidden':
      return 'Your role cannot read logger files';
    case 'network':
      return 'The file could not be sent';
    default:
      return 'The file could not be read';
  }
}

/** The judged readings, or null when the bank's facts cannot judge them (shown as a plain reason). */
function judge(engine: BankEngineInputs, samples: readonly DecaySample[]): RecordedRunVerdict | { status: 'not-judged'; reason: string } {
  try {
    return judgeRecordedRun({ samples, engine, observations: { visualFindings: [] } });
  } catch (error) {
    return { status: 'not-judged', reason: error instanceof Error ? error.message : 'The bank cannot be judged.' };
  }
}

/**
 * A logger or oscilloscope file as the readings of a decay run: pick a file, see it sent, choose
 * the columns when the file's names do not tell, then a preview (the chart with the live fit and
 * the left-out readings, a one-line verdict) and "Use these readings".
 */
export function LoggerUpload({ engine, onUse }: LoggerUploadProps) {
  const id = useId();
  const inputId = `${id}-file`;
  const upload = usePreviewLoggerFile();
  const [file, setFile] = useState<File | null>(null);
  const [localProblem, setLocalProblem] = useState<string | null>(null);
  const [progress, setProgress] = useState(0);
  const [preview, setPreview] = useState<LoggerFilePreview | null>(null);
  const [candidates, setCandidates] = useState<LoggerColumnCandidates | null>(null);
  // the columns as read, preselected when the person asks to choose other ones
  const [chosen, setChosen] = useState<{ time: string; volts: string } | undefined>(undefined);
  const [usedFile, setUsedFile] = useState<string | null>(null);

  function send(toSend: File, columns: Pick<LoggerFileUpload, 'timeColumn' | 'voltsColumn'> = {}) {
    setProgress(0);
    setPreview(null);
    setUsedFile(null);
    upload.mutate(
      { file: toSend, ...columns, onProgress: setProgress },
      {
        onSuccess: (result) => {
          setCandidates(null);
          setChosen(undefined);
          setPreview(result);
        },
        onError: (error) => {
          const offered = columnCandidatesOf(error);
          if (offered) setCandidates(offered);
        },
      },
    );
  }

  function choose(picked: File | undefined) {
    upload.reset();
    setPreview(null);
    setCandidates(null);
    setChosen(undefined);
    setUsedFile(null);
    if (!picked) return;
    const problem = loggerFileProblem(picked);
    setLocalProblem(problem);
    setFile(problem ? null : picked);
    if (!problem) send(picked);
  }

  const error = upload.error;
  const columnsQuestion = error ? columnCandidatesOf(error) : null;
  return (
    <div data-testid="logger-upload" className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <input
          type="file"
          accept={ACCEPT}
          className="sr-only"
          id={inputId}
          data-testid="logger-file-input"
          onChange={(e) => {
            choose(e.target.files?.[0]);
            // the same file, fixed and chosen again, must fire a change too
            e.target.value = '';
          }}
        />
        <label htmlFor={inputId} className={`${buttonClass(file ? 'secondary' : 'primary')} min-h-12 cursor-pointer px-5 text-base`}>
          {file ? 'Choose another file' : 'Choose a logger file'}
        </label>
        {file ? (
          <span className="min-w-0 break-all text-sm text-tide-800" data-testid="logger-file-name">
            {file.name} · {(file.size / 1024).toFixed(1)} KB
          </span>
        ) : null}
      </div>
      {!file && !localProblem ? (
        <p className="text-sm text-tide-800">
          A CSV or text export of a logger or oscilloscope, up to {LOGGER_FILE_MAX_MEBIBYTES} MB: a time column and the DC-bus voltage from the moment
          of isolation. Preambles, semicolons, decimal commas, clock times and UTF-16 are read as loggers write them.
        </p>
      ) : null}
      {localProblem ? (
        <p role="alert" className="text-sm font-medium text-eol-600" data-testid="logger-local-problem">
          {localProblem}
        </p>
      ) : null}

      {upload.isPending ? (
        <div data-testid="logger-progress">
          <ProgressBar fraction={progress} label={progress < 1 ? `Sending ${file?.name ?? 'the file'}` : 'Reading the file…'} />
        </div>
      ) : null}

      {candidates && file ? (
        <ColumnPicker
          key={`${candidates.headerRow}-${candidates.columns.join('|')}-${chosen?.time ?? ''}-${chosen?.volts ?? ''}`}
          candidates={candidates}
          initial={chosen}
          message={columnsQuestion ? error!.message : null}
          pending={upload.isPending}
          onRead={(timeColumn, voltsColumn) => send(file, { timeColumn, voltsColumn })}
        />
      ) : null}

      {error && !columnsQuestion && !upload.isPending ? (
        <div data-testid="logger-error">
          <ErrorPanel
            title={refusalTitle(error)}
            action={
              <label htmlFor={inputId} className={`${buttonClass('secondary')} min-h-12 cursor-pointer`}>
                Choose another file
              </label>
            }
          >
            {error.message}
          </ErrorPanel>
        </div>
      ) : null}

      {preview ? (
        <LoggerPreview
          preview={preview}
          engine={engine}
          used={usedFile === preview.fileName}
          onChooseColumns={() => {
            const at = (name: string) => String(preview.header.columns.indexOf(name) + 1);
            setChosen({ time: at(preview.timeColumn), volts: at(preview.voltsColumn) });
            setCandidates({ question: 'voltsColumn', headerRow: preview.headerRow, ...preview.header });
          }}
          onUse={() => {
            onUse(preview.samples, { fileName: preview.fileName });
            setUsedFile(preview.fileName);
          }}
        />
      ) : null}
    </div>
  );
}

/** The column picker: the file's header and first rows, and a select for the time and the voltage. */
function ColumnPicker({
  candidates,
  initial,
  message,
  pending,
  onRead,
}: {
  candidates: LoggerColumnCandidates;
  /** The columns preselected (1-based numbers); by default the first for the time, the next for the voltage. */
  initial?: { time: string; volts: string };
  /** The reader's question, when the last answer was one (else a refusal shows below). */
  message: string | null;
  pending: boolean;
  onRead: (timeColumn: string, voltsColumn: string) => void;
}) {
  const id = useId();
  const { columns, rows } = candidates;
  // a first guess the person checks: the first column for the time, the next for the voltage
  const [time, setTime] = useState(initial?.time ?? '1');
  const [volts, setVolts] = useState(initial?.volts ?? (columns.length > 1 ? '2' : '1'));
  const same = time === volts;
  const label = (name: string, i: number) => `${i + 1} · ${name || '(no name)'}`;
  const columnOptions = columns.map((name, i) => (
    <option key={i} value={String(i + 1)}>
      {label(name, i)}
    </option>
  ));
  return (
    <section className="space-y-3 rounded-xl border border-watch-600/40 bg-watch-600/5 p-4" data-testid="logger-columns" aria-labelledby={`${id}-title`}>
      <h3 id={`${id}-title`} className="font-bold text-tide-950">
        Which columns hold the time and the DC-bus voltage?
      </h3>
      {message ? (
        <p className="text-sm text-tide-900" data-testid="logger-columns-question">
          {message}
        </p>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-tide-100 bg-white">
        <table className="min-w-full text-left text-sm" aria-label={`The file's header (row ${candidates.headerRow}) and its first rows`}>
          <thead className="bg-tide-50 text-tide-900">
            <tr>
              {columns.map((name, i) => (
                <th key={i} scope="col" className="whitespace-nowrap px-2 py-1.5 font-medium">
                  {label(name, i)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="font-mono text-tide-800">
            {rows.map((cells, r) => (
              <tr key={r} className="border-t border-tide-100">
                {columns.map((_, i) => (
                  <td key={i} className="whitespace-nowrap px-2 py-1">
                    {cells[i] ?? ''}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id={`${id}-time`} label="Time column" hint="Seconds, milliseconds or clock times since the isolation">
          <Select id={`${id}-time`} data-testid="logger-time-column" className="min-h-12" value={time} onChange={(e) => setTime(e.target.value)}>
            {columnOptions}
          </Select>
        </Field>
        <Field id={`${id}-volts`} label="Voltage column" hint="The DC bus, in V (or mV, kV as its header says)" error={same ? 'Choose two different columns.' : undefined}>
          <Select id={`${id}-volts`} data-testid="logger-volts-column" className="min-h-12" invalid={same} value={volts} onChange={(e) => setVolts(e.target.value)}>
            {columnOptions}
          </Select>
        </Field>
      </div>
      <Button variant="primary" className="min-h-12 w-full text-base sm:w-auto" disabled={same || pending} onClick={() => onRead(time, volts)} data-testid="logger-read-columns">
        Read the file with these columns
      </Button>
    </section>
  );
}

/** The preview of the file's readings: what was read, the chart with the live fit, the verdict line, and "Use these readings". */
function LoggerPreview({
  preview,
  engine,
  used,
  onChooseColumns,
  onUse,
}: {
  preview: LoggerFilePreview;
  engine: BankEngineInputs;
  used: boolean;
  onChooseColumns: () => void;
  onUse: () => void;
}) {
  const verdict = useMemo(() => judge(engine, preview.samples), [engine, preview.samples]);
  const fitLeftOut = useMemo(
    () => (verdict.status === 'ok' ? [...leftOutRows(verdict.fit.excluded, preview.rowNumbers).entries()] : []),
    [verdict, preview.rowNumbers],
  );
  const n = preview.samples.length;
  const last = preview.samples[n - 1];
  return (
    <section className="space-y-3" data-testid="logger-preview" aria-label={`Readings of ${preview.fileName}`}>
      <p className="text-sm text-tide-900" data-testid="logger-read-summary">
        <b>{n.toLocaleString('en')}</b> readings from <span className="break-all">{preview.fileName}</span>
        {last ? ` over ${seconds(last.tSeconds)}` : ''}: time from “{preview.timeColumn}”, voltage from “{preview.voltsColumn}” (header on row{' '}
        {preview.headerRow}
        {preview.rowCount !== n ? `; ${preview.rowCount.toLocaleString('en')} rows in the file` : ''}).
      </p>
      {preview.warnings.length ? (
        <ul className="list-disc space-y-1 pl-5 text-sm text-tide-800" data-testid="logger-warnings">
          {preview.warnings.map((warning) => (
            <li key={warning}>{warning}</li>
          ))}
        </ul>
      ) : null}
      <VerdictLine verdict={verdict} />
      {verdict.status === 'ok' ? <DecayPlot samples={preview.samples} verdict={verdict} /> : null}
      {fitLeftOut.some(([, mark]) => mark.explanation) ? (
        <div className="space-y-1 text-sm text-tide-900" data-testid="logger-left-out">
          <p className="font-medium">Left out of the fit (marked ⊗ on the chart):</p>
          <ul className="list-disc space-y-1 pl-5">
            {fitLeftOut
              .filter(([, mark]) => mark.explanation)
              .map(([row, mark]) => (
                <li key={row}>
                  {mark.label === 'left out' ? `Row ${row}: ` : ''}
                  {mark.explanation}
                </li>
              ))}
          </ul>
        </div>
      ) : null}
      {preview.header.columns.length > 2 ? (
        <Button className="min-h-12 w-full" onClick={onChooseColumns} data-testid="logger-choose-columns">
          Choose other columns
        </Button>
      ) : null}
      <DischargeCaution compact />
      <Button variant="primary" className="min-h-14 w-full text-base" onClick={onUse} data-testid="logger-use">
        Use these readings
      </Button>
      {used ? (
        <p role="status" className="text-sm font-medium text-ok-600" data-testid="logger-used">
          The {n.toLocaleString('en')} readings of {preview.fileName} are in use.
        </p>
      ) : null}
    </section>
  );
}

/** One line of the verdict the readings give now, before they are recorded. */
function VerdictLine({ verdict }: { verdict: RecordedRunVerdict | { status: 'not-judged'; reason: string } }) {
  if (verdict.status !== 'ok') {
    return (
      <p className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950" data-testid="logger-summary">
        <b>Unusable: these readings cannot be judged.</b> {verdict.reason}
      </p>
    );
  }
  return (
    <p className="rounded-lg bg-tide-50 px-3 py-2 text-sm text-tide-950" data-testid="logger-summary">
      Health: <b>{verdict.healthLabel ?? 'not judged'}</b> · τ {seconds(verdict.tauSeconds)}
      {verdict.baseline ? ` · ${formatPercentFigure(verdict.baseline.ratio)} of baseline` : ''}
      {verdict.fit.excluded.length ? ` · ${verdict.fit.excluded.length} left out of the fit` : ''}
      {verdict.safetyFinding ? <b className="text-eol-600"> · ⚠ safety finding</b> : null}
    </p>
  );
}
