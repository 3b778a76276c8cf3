import { useRef, useState } from 'react';
import { Link } from 'react-router';
import { IMPORT_MAX_BYTES, IMPORT_MAX_ROWS } from '../../../../../shared/constants/register';
import { SHUTDOWN_WINDOW_IMPORT_COLUMNS, type ShutdownWindowImportPreview } from '../../../../../shared/schemas/shutdown-window-import';
import { Badge } from '../../../components/ui/badge';
import { Button, buttonClass } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { PageHeader } from '../../../components/ui/page-header';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { ApiError } from '../../../lib/api-client';
import { useUploadShutdownWindows, WINDOW_IMPORT_TEMPLATE_URL } from '../api/import-windows';
import { windowTimeText } from '../utils/window-times';

const MAX_MB = IMPORT_MAX_BYTES / 1024 / 1024;

/** Checks in the browser what the server checks too, so a wrong file is named before it is sent. */
function fileProblem(file: File): string | null {
  if (!/\.csv$/i.test(file.name)) return `${file.name} is not a .csv file. In your spreadsheet, save as “CSV (comma or semicolon separated)”.`;
  if (file.size > IMPORT_MAX_BYTES) return `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${MAX_MB} MB. Split it and import the parts.`;
  if (file.size === 0) return `${file.name} is empty.`;
  return null;
}

const isRowRefusal = (error: unknown) => error instanceof ApiError && (error.code === 'import-rejected' || error.code === 'confirmation-needed');

function ProblemsTable({ preview }: { preview: ShutdownWindowImportPreview }) {
  return (
    <div className="overflow-x-auto rounded-xl border border-eol-600/30 bg-white">
      <table className="w-full text-left text-sm" data-testid="import-problems">
        <caption className="bg-eol-600/5 px-4 py-2 text-left font-bold text-eol-600">
          {preview.problemCount.toLocaleString('en-GB')} problem{preview.problemCount === 1 ? '' : 's'} to fix
          {preview.problemsNotListed > 0 ? ` (the first ${preview.problems.length} listed)` : ''}: nothing is imported until every row is right
        </caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2 sm:px-4">Row</th>
            <th className="px-3 py-2 sm:px-4">Column</th>
            <th className="px-3 py-2 sm:px-4">Reason</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {preview.problems.map((p, i) => (
            <tr key={`${p.row}-${p.column}-${i}`} data-testid="import-problem" data-row={p.row} data-column={p.column}>
              <td className="px-3 py-2 font-mono sm:px-4">{p.row}</td>
              <td className="whitespace-nowrap px-3 py-2 font-mono sm:px-4">{p.column || '—'}</td>
              <td className="min-w-40 px-3 py-2 sm:px-4">{p.reason}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {preview.problemsNotListed > 0 ? (
        <p className="px-3 py-2 text-sm font-medium text-eol-600 sm:px-4">
          …and {preview.problemsNotListed.toLocaleString('en-GB')} more not listed here. Fix these, then upload the file again to see the rest.
        </p>
      ) : null}
    </div>
  );
}

function QuestionsPanel({
  preview,
  checked,
  onCheckedChange,
}: {
  preview: ShutdownWindowImportPreview;
  checked: boolean;
  onCheckedChange: (checked: boolean) => void;
}) {
  const count = preview.questionCount;
  return (
    <div className="overflow-x-auto rounded-xl border border-watch-600/40 bg-white" data-testid="import-questions-panel">
      <table className="w-full text-left text-sm">
        <caption className="bg-spark-300/15 px-4 py-2 text-left font-bold text-watch-600">
          Are you sure? {count.toLocaleString('en-GB')} unlikely value{count === 1 ? '' : 's'}
          {preview.questionsNotListed > 0 ? ` (the first ${preview.questions.length} listed)` : ''}
        </caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2 sm:px-4">Row</th>
            <th className="hidden px-3 py-2 sm:table-cell sm:px-4">Column</th>
            <th className="px-3 py-2 sm:px-4">Question</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {preview.questions.map((q, i) => (
            <tr key={`${q.row}-${q.column}-${i}`} data-testid="import-question">
              <td className="px-3 py-2 align-top font-mono sm:px-4 sm:align-middle">
                {q.row}
                <span className="block text-xs text-tide-600 sm:hidden">{q.column}</span>
              </td>
              <td className="hidden whitespace-nowrap px-3 py-2 font-mono sm:table-cell sm:px-4">{q.column}</td>
              <td className="px-3 py-2 sm:px-4">{q.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <label className="flex min-h-11 items-center gap-3 border-t border-watch-600/20 px-3 py-2 text-sm font-medium text-tide-900 sm:px-4">
        <input type="checkbox" className="h-5 w-5 shrink-0 accent-tide-600" checked={checked} onChange={(e) => onCheckedChange(e.target.checked)} />
        I have checked these values
      </label>
    </div>
  );
}

function RowsList({ preview }: { preview: ShutdownWindowImportPreview }) {
  return (
    <div className="overflow-hidden rounded-xl border border-tide-100 bg-white shadow-sm">
      <ul className="divide-y divide-tide-100" data-testid="import-rows" aria-label="Rows of the file">
        {preview.rows.map((r) => (
          <li key={r.row} className={`px-3 py-2 text-sm sm:px-4 ${r.problems.length ? 'bg-eol-600/5' : ''}`}>
            <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
              <span className="font-mono text-tide-600">Row {r.row}</span>
              <span className="font-medium text-tide-900">{r.title || '(no title)'}</span>
              <span className="text-tide-800">
                {r.site} · {r.area}
              </span>
            </div>
            <div className="mt-0.5 text-tide-800">
              {r.startsAt && r.endsAt && r.timeZone ? windowTimeText(r.startsAt, r.endsAt, r.timeZone) : `${r.values.start ?? ''} – ${r.values.end ?? ''}`}
              {r.recurrence ? <span className="text-tide-600"> · repeats {r.recurrenceText}</span> : null}
            </div>
            <div className="mt-0.5">
              {r.problems.length ? (
                <span className="text-eol-600">{r.problems.map((p) => `${p.column}: ${p.reason}`).join('; ')}</span>
              ) : r.questions.length ? (
                <span className="text-watch-600">are you sure? {r.questions.map((q) => q.column).join(', ')}</span>
              ) : (
                <span className="text-ok-600">ready</span>
              )}
            </div>
          </li>
        ))}
      </ul>
      {preview.rowCount > preview.rows.length ? (
        <p className="px-3 py-2 text-sm text-tide-600">…and {(preview.rowCount - preview.rows.length).toLocaleString('en-GB')} more rows.</p>
      ) : null}
    </div>
  );
}

/**
 * Importing shutdown windows from CSV, with the cabinet import's rules: template, upload with
 * progress, a preview naming every problem by row and column, questions to confirm, and all
 * rows or none.
 */
export function ShutdownWindowImportScreen({ canImport, csrfToken }: { canImport: boolean; csrfToken: string | null }) {
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [localProblem, setLocalProblem] = useState<string | null>(null);
  const [progress, setProgress] = useState(0);
  const [preview, setPreview] = useState<ShutdownWindowImportPreview | null>(null);
  const [questionsChecked, setQuestionsChecked] = useState(false);
  const upload = useUploadShutdownWindows();

  const send = (chosen: File, mode: 'preview' | 'commit') => {
    setProgress(0);
    upload.mutate(
      { file: chosen, mode, csrfToken, confirmed: mode === 'commit' && questionsChecked, onProgress: setProgress },
      {
        onSuccess: (result) => {
          if (!result.committed) setQuestionsChecked(false);
          setPreview(result);
        },
        onError: (error) => {
          // a commit refused for problems found since the preview: show them as the preview does
          if (isRowRefusal(error)) send(chosen, 'preview');
        },
      },
    );
  };
  const choose = (chosen: File | undefined) => {
    setPreview(null);
    upload.reset();
    if (!chosen) return;
    const problem = fileProblem(chosen);
    setLocalProblem(problem);
    setFile(problem ? null : chosen);
    if (!problem) send(chosen, 'preview');
  };

  const back = (
    <Link to="/planner" className="text-sm font-medium text-tide-600 hover:text-tide-900">
      ← Planner
    </Link>
  );
  if (!canImport) {
    return (
      <div className="space-y-3">
        {back}
        <PageHeader title="Import shutdown windows" />
        <p className="text-tide-800">Importing shutdown windows is for maintenance planners and admins.</p>
      </div>
    );
  }
  const committed = preview?.committed;
  return (
    <div className="space-y-5">
      {back}
      <PageHeader
        title="Import shutdown windows from a CSV file"
        lead="One window per row: when an area's drives are de-energised. Times are the site's local time."
        actions={
          <a className={buttonClass('secondary')} href={WINDOW_IMPORT_TEMPLATE_URL} download>
            Download the template
          </a>
        }
      />
      <Card title="1 · Choose the file">
        <p className="text-sm text-tide-800">
          Columns as in the template (a spreadsheet saved as CSV works, with commas or semicolons). Up to {MAX_MB} MB and{' '}
          {IMPORT_MAX_ROWS.toLocaleString('en-GB')} rows. The site and area must exist. Start and end are written{' '}
          <span className="font-mono">2027-01-09 06:00</span>, on the site's clock. For a repeating window, give an RRULE such as{' '}
          <span className="font-mono">FREQ=WEEKLY;BYDAY=SA;COUNT=8</span> (in a semicolon-separated file, in quotes).
        </p>
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-medium text-tide-600">The columns</summary>
          <ul className="mt-2 grid gap-1 sm:grid-cols-2">
            {SHUTDOWN_WINDOW_IMPORT_COLUMNS.map((c) => (
              <li key={c.name}>
                <span className="font-mono">{c.name}</span>
                {c.required ? <span className="text-eol-600"> *</span> : null} <span className="text-tide-600">{c.hint}</span>
              </li>
            ))}
          </ul>
        </details>
        <div className="mt-4 flex flex-wrap items-center gap-3">
          <input
            ref={input}
            type="file"
            accept=".csv,text/csv"
            className="sr-only"
            id="window-import-file"
            data-testid="import-file"
            onChange={(e) => {
              choose(e.target.files?.[0]);
              e.target.value = '';
            }}
          />
          <label htmlFor="window-import-file" className={buttonClass('primary')}>
            {file ? 'Choose another file' : 'Choose a CSV file'}
          </label>
          {file ? (
            <span className="text-sm text-tide-800">
              {file.name} · {(file.size / 1024).toFixed(1)} KB
            </span>
          ) : null}
        </div>
        {localProblem ? (
          <p role="alert" className="mt-3 text-sm font-medium text-eol-600">
            {localProblem}
          </p>
        ) : null}
        {upload.isPending ? (
          <div className="mt-4">
            <ProgressBar fraction={progress} label={progress < 1 ? `Uploading ${file?.name ?? ''}` : 'Checking every row…'} />
          </div>
        ) : null}
        {upload.isError && !isRowRefusal(upload.error) ? (
          <div className="mt-4">
            <ErrorPanel title="The file could not be read">{upload.error.message}</ErrorPanel>
          </div>
        ) : null}
      </Card>

      {preview && !committed ? (
        <Card title="2 · Check the rows">
          <div className="mb-4 flex flex-wrap gap-2 text-sm" data-testid="import-summary">
            <Badge>{preview.rowCount} rows</Badge>
            <Badge tone="ok">{preview.validCount} ready</Badge>
            {preview.problemCount ? <Badge tone="danger">{preview.problemCount} problems</Badge> : null}
            {preview.questionCount ? <Badge tone="warn">{preview.questionCount} to check</Badge> : null}
            {preview.ignoredColumns.length ? <Badge tone="muted">left out: {preview.ignoredColumns.join(', ')}</Badge> : null}
          </div>
          <div className="space-y-4">
            {preview.problemCount ? <ProblemsTable preview={preview} /> : null}
            {preview.questionCount ? <QuestionsPanel preview={preview} checked={questionsChecked} onCheckedChange={setQuestionsChecked} /> : null}
            <RowsList preview={preview} />
          </div>
          <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-tide-100 pt-4">
            <Button
              variant="primary"
              disabled={preview.problemCount > 0 || (preview.questionCount > 0 && !questionsChecked) || upload.isPending || !file}
              onClick={() => file && send(file, 'commit')}
            >
              Import {preview.rowCount} window{preview.rowCount === 1 ? '' : 's'}
            </Button>
            <span className="text-sm text-tide-800">
              {preview.problemCount
                ? 'Fix the rows above in your file and choose it again.'
                : preview.questionCount && !questionsChecked
                  ? 'Check the unlikely values above: correct them in your file, or tick the box to keep them.'
                  : 'All rows go in together, or none do.'}
            </span>
          </div>
        </Card>
      ) : null}

      {committed ? (
        <Card title="Imported">
          <p className="text-tide-900" role="status" data-testid="import-done">
            {preview.createdCount} shutdown window{preview.createdCount === 1 ? '' : 's'} from {preview.fileName} are on the Planner.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            <Link className={buttonClass('primary')} to="/planner">
              Open the Planner
            </Link>
            <Button
              onClick={() => {
                setPreview(null);
                setFile(null);
              }}
            >
              Import another file
            </Button>
          </div>
        </Card>
      ) : null}
    </div>
  );
}
