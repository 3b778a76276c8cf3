import type { PlanningWarning, PlanningWarningKind } from '../api/shapes';
import { groupWarnings, isReasonGiven, MIN_REASON_LENGTH } from '../utils/warnings';
import { inputClass } from '../../../components/ui/field';

/**
 * The planning warnings of a visit before it is saved, one block per kind, each with the reason
 * field that accepts it. Saving is allowed once every kind has a reason.
 */
export function WarningOverrides({
  warnings,
  reasons,
  onReason,
  checking,
  idPrefix,
}: {
  warnings: readonly PlanningWarning[];
  reasons: Partial<Record<PlanningWarningKind, string>>;
  onReason: (kind: PlanningWarningKind, reason: string) => void;
  checking: boolean;
  idPrefix: string;
}) {
  const groups = groupWarnings(warnings);
  if (groups.length === 0) {
    return (
      <p className="rounded-lg bg-ok-600/10 px-3 py-2 text-sm text-ok-600" role="status">
        {checking ? 'Checking windows, bookings and due dates…' : 'No planning warnings: inside a shutdown window, nobody double-booked, every bank due.'}
      </p>
    );
  }
  return (
    <section aria-label="Planning warnings" className="space-y-3">
      {groups.map((group) => {
        const id = `${idPrefix}-override-${group.kind}`;
        const given = isReasonGiven(reasons[group.kind]);
        return (
          <div key={group.kind} className="rounded-lg border border-watch-600/40 bg-watch-600/5 p-3">
            <p className="text-sm font-bold text-watch-600">⚠ {group.label}</p>
            <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm text-tide-900">
              {group.messages.map((message) => (
                <li key={message}>{message}</li>
              ))}
            </ul>
            <label htmlFor={id} className="mt-2 block text-sm font-medium text-tide-900">
              Reason to plan it anyway
            </label>
            <input
              id={id}
              className={inputClass}
              value={reasons[group.kind] ?? ''}
              onChange={(event) => onReason(group.kind, event.target.value)}
              aria-describedby={`${id}-hint`}
              placeholder="e.g. agreed with production for a short stop"
            />
            <p id={`${id}-hint`} className={`mt-1 text-xs ${given ? 'text-tide-600' : 'text-watch-600'}`}>
              {given ? 'Kept with the visit and in its audit trail.' : `At least ${MIN_REASON_LENGTH} characters; kept with the visit.`}
            </p>
          </div>
        );
      })}
    </section>
  );
}
