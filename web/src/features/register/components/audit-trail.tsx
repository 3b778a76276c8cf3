import type { AuditChange, AuditEntry } from '../../../../../shared/schemas/audit';
import { Card } from '../../../components/ui/card';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant, fromNow } from '../../../lib/dates';

const ACTION_LABELS: Record<AuditEntry['action'], string> = {
  create: 'Added',
  update: 'Changed',
  retire: 'Retired',
  restore: 'Restored',
  replace: 'Replaced',
  baseline: 'Baseline',
  import: 'Imported',
  start: 'Started',
  log: 'Logged',
  review: 'Reviewed',
  cancel: 'Cancelled',
  replan: 'Replanned',
  miss: 'Marked missed',
  record: 'Recorded',
  correct: 'Corrected',
};

// words a reader knows, where the field's own name would not do
const FIELD_LABELS: Record<string, string> = {
  areaId: 'area',
  siteId: 'site',
  cabinetId: 'cabinet',
  bankDesignId: 'bank design',
  currentVersionId: 'current revision',
  markedWaitMinutes: 'marked wait (min)',
  supplyVolts: 'supply (V)',
  dcBusVolts: 'DC bus (V)',
  ratedPowerKilowatts: 'rated power (kW)',
  unitCapacitanceMicrofarads: 'unit capacitance (µF)',
  unitRatedVolts: 'unit rated voltage (V)',
  bleederOhms: 'bleeder (Ω)',
  capacitanceTolerancePercent: 'tolerance (± %)',
  tempCoefficientPercentPerKelvin: 'temperature coefficient (%/K)',
  ratedLifeHours: 'rated life (h)',
  ratedLifeCelsius: 'rated temperature (°C)',
  watchRatio: 'watch limit',
  endOfLifeRatio: 'end-of-life limit',
  inspectionIntervalDays: 'inspection interval (days)',
  baselineTauSeconds: 'baseline τ (s)',
  baselineCapacitanceMicrofarads: 'baseline capacitance (µF)',
  baselineSource: 'baseline source',
  baselineSetAt: 'baseline set at',
  baselineSetById: 'baseline set by',
  baselineDesignVersionId: 'baseline design revision',
  baselineDecayRunId: 'baseline decay run',
  replacesBankId: 'replaces bank',
  replacedByBankId: 'replaced by bank',
  reformingIntervalDays: 'reforming interval (days)',
  retiredAt: 'retired at',
};

function fieldLabel(field: string): string {
  return FIELD_LABELS[field] ?? field.replace(/([A-Z])/g, ' $1').toLowerCase();
}

function show(value: unknown, field: string): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string' && /Id$/.test(field) && /^[0-9a-f-]{36}$/.test(value)) return `#${value.slice(0, 8)}`;
  if (typeof value === 'string' && /At$/.test(field)) return formatInstant(value);
  if (typeof value === 'number') return value.toLocaleString('en-GB', { maximumFractionDigits: 4 });
  return String(value);
}

function Changes({ changes }: { changes: AuditChange[] }) {
  return (
    <table className="mt-2 w-full table-fixed text-left text-xs">
      <thead className="text-tide-600">
        <tr>
          <th className="w-1/3 py-1 font-medium">Field</th>
          <th className="py-1 font-medium">Before</th>
          <th className="py-1 font-medium">After</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-tide-100">
        {changes.map((c) => (
          <tr key={c.field}>
            <td className="py-1 pr-2 text-tide-800">{fieldLabel(c.field)}</td>
            <td className="break-words py-1 pr-2 text-tide-600 line-through decoration-tide-200">{show(c.before, c.field)}</td>
            <td className="break-words py-1 text-tide-950">{show(c.after, c.field)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A record's audit trail: who did what and when, with the values before and after. */
export function AuditTrail({ entries, isPending, error }: { entries?: AuditEntry[]; isPending: boolean; error: Error | null }) {
  return (
    <Card title="History">
      {isPending ? (
        <Spinner label="Loading the history…" />
      ) : error ? (
        <ErrorPanel title="The history could not be loaded">{error.message}</ErrorPanel>
      ) : !entries?.length ? (
        <p className="text-sm text-tide-600">No changes recorded.</p>
      ) : (
        <ol className="space-y-4" data-testid="audit-trail">
          {entries.map((entry) => (
            <li key={entry.id} className="border-l-2 border-tide-200 pl-3" data-testid="audit-entry" data-action={entry.action}>
              <p className="text-sm">
                <span className="mr-2 rounded bg-tide-100 px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide text-tide-800">
                  {ACTION_LABELS[entry.action]}
                </span>
                <span className="text-tide-950">{entry.summary}</span>
              </p>
              <p className="mt-0.5 text-xs text-tide-600">
                {entry.actor?.name ?? 'Ebbline'} ·{' '}
                <time dateTime={entry.at} title={formatInstant(entry.at)}>
                  {fromNow(entry.at)}
                </time>
              </p>
              {entry.action !== 'create' && entry.action !== 'import' && entry.changes.length > 0 ? (
                <details className="mt-1" open={entry.changes.length <= 3}>
                  <summary className="cursor-pointer text-xs font-medium text-tide-600">
                    {entry.changes.length} field{entry.changes.length === 1 ? '' : 's'} changed
                  </summary>
                  <Changes changes={entry.changes} />
                </details>
              ) : null}
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
