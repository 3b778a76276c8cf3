import { Link } from 'react-router';
import { IMPORT_MAX_BYTES, IMPORT_MAX_ROWS } from '../../../../../shared/constants/register';
import { SHUTDOWN_WINDOW_IMPORT_COLUMNS, type ShutdownWindowImportPreview } from '../../../../../shared/schemas/shutdown-window-import';
import { buttonClass } from '../../../components/ui/button';
import { CsvImportSteps } from '../../../components/ui/csv-import';
import { PageHeader } from '../../../components/ui/page-header';
import { useUploadShutdownWindows, WINDOW_IMPORT_TEMPLATE_URL } from '../api/import-windows';
import { windowTimeText } from '../utils/window-times';

const MAX_MB = IMPORT_MAX_BYTES / 1024 / 1024;

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
  const upload = useUploadShutdownWindows();

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
      <CsvImportSteps<ShutdownWindowImportPreview>
        upload={upload}
        csrfToken={csrfToken}
        maxBytes={IMPORT_MAX_BYTES}
        fileInputId="window-import-file"
        intro={
          <>
            Columns as in the template (a spreadsheet saved as CSV works, with commas or semicolons). Up to {MAX_MB} MB and{' '}
            {IMPORT_MAX_ROWS.toLocaleString('en-GB')} rows. The site and area must exist. Start and end are written{' '}
            <span className="font-mono">2027-01-09 06:00</span>, on the site's clock. For a repeating window, give an RRULE such as{' '}
            <span className="font-mono">FREQ=WEEKLY;BYDAY=SA;COUNT=8</span> (in a semicolon-separated file, in quotes).
          </>
        }
        columns={SHUTDOWN_WINDOW_IMPORT_COLUMNS}
        problemsNotListedNote={(preview) => (
          <>
            …and {preview.problemsNotListed.toLocaleString('en-GB')} more not listed here. Fix these, then upload the file again to see
            the rest.
          </>
        )}
        questionsListNotListed={false}
        rows={(preview) => <RowsList preview={preview} />}
        commitLabel={(preview) => `Import ${preview.rowCount} window${preview.rowCount === 1 ? '' : 's'}`}
        doneMessage={(preview) =>
          `${preview.createdCount} shutdown window${preview.createdCount === 1 ? '' : 's'} from ${preview.fileName} are on the Planner.`
        }
        doneLink={
          <Link className={buttonClass('primary')} to="/planner">
            Open the Planner
          </Link>
        }
      />
    </div>
  );
}
