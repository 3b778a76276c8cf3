import { Link } from 'react-router';
import { IMPORT_MAX_BYTES, IMPORT_MAX_ROWS } from '../../../../../shared/constants/register';
import { CABINET_IMPORT_COLUMNS, type ImportPreview } from '../../../../../shared/schemas/cabinet-import';
import { Badge } from '../../../components/ui/badge';
import { buttonClass } from '../../../components/ui/button';
import { CsvImportSteps } from '../../../components/ui/csv-import';
import { CABINET_IMPORT_TEMPLATE_URL, useUploadCabinetRegister } from '../api/cabinet-import';
import { ReadOnlyNote, useRegisterPermissions } from './permissions';
import { RecordHeader } from './record-parts';

const MAX_MB = IMPORT_MAX_BYTES / 1024 / 1024;

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
  const upload = useUploadCabinetRegister();

  if (!can.editRegister) {
    return (
      <div>
        <RecordHeader back={{ to: '/register/cabinets', label: 'Cabinets' }} kind="Import" title="Import cabinets" />
        <ReadOnlyNote>Importing is for maintenance planners and admins.</ReadOnlyNote>
      </div>
    );
  }
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
      <CsvImportSteps<ImportPreview>
        upload={upload}
        csrfToken={can.csrfToken}
        maxBytes={IMPORT_MAX_BYTES}
        fileInputId="import-file"
        intro={
          <>
            One cabinet per row, columns as in the template (a spreadsheet saved as CSV works, with commas or semicolons). Up to{' '}
            {MAX_MB} MB and {IMPORT_MAX_ROWS.toLocaleString('en-GB')} rows. The site must exist; a new area name creates the area.
          </>
        }
        columns={CABINET_IMPORT_COLUMNS}
        summaryBadges={(preview) =>
          preview.newAreas.length ? <Badge tone="spark">new areas: {preview.newAreas.join(', ')}</Badge> : null
        }
        questionsCheckAgainst="the cabinet"
        rows={(preview) => <RowsTable preview={preview} />}
        commitLabel={(preview) => `Import ${preview.rowCount} cabinet${preview.rowCount === 1 ? '' : 's'}`}
        doneMessage={(preview) => (
          <>
            {preview.createdCount} cabinet{preview.createdCount === 1 ? '' : 's'} from {preview.fileName} are in the register
            {preview.newAreas.length ? `, with the new area${preview.newAreas.length === 1 ? '' : 's'} ${preview.newAreas.join(', ')}` : ''}.
          </>
        )}
        doneLink={
          <Link className={buttonClass('primary')} to="/register/cabinets?sort=-updatedAt">
            See the cabinets
          </Link>
        }
      />
    </div>
  );
}
