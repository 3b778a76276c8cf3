import { useRef, useState } from 'react';
import { Link } from 'react-router';
import { IMPORT_MAX_BYTES, IMPORT_MAX_ROWS } from '../../../../../shared/constants/register';
import { CABINET_IMPORT_COLUMNS, type ImportPreview } from '../../../../../shared/schemas/cabinet-import';
import { Badge } from '../../../components/ui/badge';
import { Button, buttonClass } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { ApiError } from '../../../lib/api-client';
import { CABINET_IMPORT_TEMPLATE_URL, useUploadCabinetRegister } from '../api/cabinet-import';
import { ImportQuestions } from './cabinet-import-questions';
import { ReadOnlyNote, useRegisterPermissions } from './permissions';
import { RecordHeader } from './record-parts';

const MAX_MB = IMPORT_MAX_BYTES / 1024 / 1024;

/** Checks in the browser what the server checks too, so a wrong file is named before it is sent. */
function fileProblem(file: File): string | null {
  if (!/\.csv$/i.test(file.name)) return `${file.name} is not a .csv file. In your spreadsheet, save as “CSV (comma or semicolon separated)”.`;
  if (file.size > IMPORT_MAX_BYTES) return `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${MAX_MB} MB. Split it and import the parts.`;
  if (file.size === 0) return `${file.name} is empty.`;
  return null;
}

function ProblemsTable({ preview }: { preview: ImportPreview }) {
  return (
    <div className="overflow-x-auto rounded-xl border border-eol-600/30 bg-white">
      <table className="w-full text-left text-sm" data-testid="import-problems">
        <caption className="bg-eol-600/5 px-4 py-2 text-left font-bold text-eol-600">
          {preview.problemCount.toLocaleString('en-GB')} problem{preview.problemCount === 1 ? '' : 's'} to fix
          {preview.problemsNotListed > 0 ? ` (the first ${preview.problems.length} listed)` : ''}: nothing is imported until every row is
          right
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
        <p className="px-3 py-2 text-sm font-medium text-eol-600 sm:px-4" data-testid="import-problems-not-listed">
          …and {preview.problemsNotListed.toLocaleString('en-GB')} more problem{preview.problemsNotListed === 1 ? '' : 's'} not listed here
          (the first {preview.problems.length} are shown). Fix these, then upload the file again to see the rest.
        </p>
      ) : null}
    </div>
  );
}

function RowsTable({ preview }: { preview: ImportPreview }) {
  // the server sends the first rows only; rowCount counts them all
  const shown = preview.rows;
  return (
    <div className="overflow-x-auto rounded-xl border border-tide-100 bg-white shadow-sm">
      <table className="w-full text-left text-sm" data-testid="import-rows">
        <caption className="sr-only">Rows of the file</caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2">Row</th>
            <th className="px-3 py-2">Tag</th>
            <th className="px-3 py-2">Site</th>
            <th className="px-3 py-2">Area</th>
            <th className="px-3 py-2">Drive</th>
            <th className="px-3 py-2">Supply</th>
            <th className="px-3 py-2">Check</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {shown.map((r) => (
            <tr key={r.row} className={`whitespace-nowrap ${r.problems.length ? 'bg-eol-600/5' : ''}`}>
              <td className="px-3 py-2 font-mono">{r.row}</td>
              <td className="px-3 py-2 font-mono">{r.tag}</td>
              <td className="px-3 py-2">{r.siteCode}</td>
              <td className="px-3 py-2">
                {r.area} {r.newArea ? <Badge tone="spark">new area</Badge> : null}
              </td>
              <td className="px-3 py-2">{[r.values.drive_make, r.values.drive_model].filter(Boolean).join(' ')}</td>
              <td className="px-3 py-2">{r.values.supply_volts}</td>
              <td className="min-w-64 whitespace-normal px-3 py-2">
                {r.problems.length ? (
                  <span className="text-eol-600">{r.problems.map((p) => `${p.column}: ${p.reason}`).join('; ')}</span>
                ) : r.questions.length ? (
                  <span className="text-watch-600">are you sure? {r.questions.map((q) => q.column).join(', ')}</span>
                ) : (
                  <span className="text-ok-600">ready</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {preview.rowCount > shown.length ? (
        <p className="px-3 py-2 text-sm text-tide-600">
          …and {(preview.rowCount - shown.length).toLocaleString('en-GB')} more rows
          {preview.problemsNotListed > 0 ? ' (the problems above are the first ones found).' : ' (every problem is listed above).'}
        </p>
      ) : null}
    </div>
  );
}

/** Importing a cabinet register from CSV: template, upload with progress, preview, all-or-nothing commit. */
export function CabinetImportScreen() {
  const can = useRegisterPermissions();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [localProblem, setLocalProblem] = useState<string | null>(null);
  const [progress, setProgress] = useState(0);
  const [preview, setPreview] = useState<ImportPreview | null>(null);
  // the unlikely values of this preview are checked; a new preview asks again
  const [questionsChecked, setQuestionsChecked] = useState(false);
  const upload = useUploadCabinetRegister();

  const send = (chosen: File, mode: 'preview' | 'commit') => {
    setProgress(0);
    upload.mutate(
      { file: chosen, mode, csrfToken: can.csrfToken, confirmed: mode === 'commit' && questionsChecked, onProgress: setProgress },
      {
        onSuccess: (result) => {
          if (!result.committed) setQuestionsChecked(false);
          setPreview(result);
        },
        onError: (error) => {
          // a commit refused for problems or questions found since the preview: show them as the preview does
          if (error instanceof ApiError && (error.code === 'import-rejected' || error.code === 'confirmation-needed')) send(chosen, 'preview');
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

  if (!can.editRegister) {
    return (
      <div>
        <RecordHeader back={{ to: '/register/cabinets', label: 'Cabinets' }} kind="Import" title="Import cabinets" />
        <ReadOnlyNote>Importing is for maintenance planners and admins.</ReadOnlyNote>
      </div>
    );
  }
  const committed = preview?.committed;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: '/register/cabinets', label: 'Cabinets' }}
        kind="Import"
        title="Import cabinets from a CSV file"
        actions={
          <a className={buttonClass('secondary')} href={CABINET_IMPORT_TEMPLATE_URL} download>
            Download the template
          </a>
        }
      />
      <Card title="1 · Choose the file">
        <p className="text-sm text-tide-800">
          One cabinet per row, columns as in the template (a spreadsheet saved as CSV works, with commas or semicolons). Up to{' '}
          {MAX_MB} MB and {IMPORT_MAX_ROWS.toLocaleString('en-GB')} rows. The site must exist; a new area name creates the area.
        </p>
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-medium text-tide-600">The columns</summary>
          <ul className="mt-2 grid gap-1 sm:grid-cols-2">
            {CABINET_IMPORT_COLUMNS.map((c) => (
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
            id="import-file"
            data-testid="import-file"
            onChange={(e) => {
              choose(e.target.files?.[0]);
              // the same file, fixed and chosen again, must fire a change too
              e.target.value = '';
            }}
          />
          <label htmlFor="import-file" className={buttonClass('primary')}>
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
        {upload.isError && !(upload.error instanceof ApiError && (upload.error.code === 'import-rejected' || upload.error.code === 'confirmation-needed')) ? (
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
            {preview.newAreas.length ? <Badge tone="spark">new areas: {preview.newAreas.join(', ')}</Badge> : null}
            {preview.ignoredColumns.length ? <Badge tone="muted">left out: {preview.ignoredColumns.join(', ')}</Badge> : null}
          </div>
          <div className="space-y-4">
            {preview.problemCount ? <ProblemsTable preview={preview} /> : null}
            {preview.questionCount ? (
              <ImportQuestions preview={preview} checked={questionsChecked} onCheckedChange={setQuestionsChecked} />
            ) : null}
            <RowsTable preview={preview} />
          </div>
          <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-tide-100 pt-4">
            <Button
              variant="primary"
              disabled={preview.problemCount > 0 || (preview.questionCount > 0 && !questionsChecked) || upload.isPending || !file}
              onClick={() => file && send(file, 'commit')}
            >
              Import {preview.rowCount} cabinet{preview.rowCount === 1 ? '' : 's'}
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
            {preview.createdCount} cabinet{preview.createdCount === 1 ? '' : 's'} from {preview.fileName} are in the register
            {preview.newAreas.length ? `, with the new area${preview.newAreas.length === 1 ? '' : 's'} ${preview.newAreas.join(', ')}` : ''}.
          </p>
          <div className="mt-3 flex gap-2">
            <Link className={buttonClass('primary')} to="/register/cabinets?sort=-updatedAt">
              See the cabinets
            </Link>
            <Button
              onClick={() => {
                setPreview(null);
                setFile(null);
                if (input.current) input.current.value = '';
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
