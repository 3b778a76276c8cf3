import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { ApiError } from '../../../lib/api-client';

/** Empty number fields are null (the schemas say "enter a number" for required ones). */
export const asNumber = (value: unknown): number | null =>
  value === '' || value === null || value === undefined ? null : Number(value);

/** Empty date fields are null. */
export const asDate = (value: unknown): string | null => (typeof value === 'string' && value !== '' ? value : null);

/**
 * Puts the API's field issues beside their fields. Returns true when every issue found a
 * field, so the form needs no message of its own.
 */
export function showServerIssues<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: readonly string[]): boolean {
  if (!(error instanceof ApiError) || error.issues.length === 0) return false;
  let placed = 0;
  for (const issue of error.issues) {
    if (fields.includes(issue.path)) {
      setError(issue.path as Path<T>, { type: 'server', message: issue.message });
      placed += 1;
    }
  }
  return placed === error.issues.length;
}

/** True when every issue of the error names one of the form's fields (nothing else to say). */
export function issuesAllOnFields(error: unknown, fields: readonly string[]): boolean {
  return error instanceof ApiError && error.issues.length > 0 && error.issues.every((i) => fields.includes(i.path));
}

/**
 * What went wrong with a save, said plainly. A stale version (someone else saved first)
 * offers to load their version; the person's own edits stay on screen until they choose.
 */
export function SaveProblem({
  error,
  what,
  fields = [],
  onReload,
}: {
  error: unknown;
  what: string;
  /** The form's fields: issues about them already show beside them. */
  fields?: readonly string[];
  onReload?: () => void;
}) {
  if (!error || issuesAllOnFields(error, fields)) return null;
  const stale = error instanceof ApiError && error.code === 'stale-version';
  const message = error instanceof Error ? error.message : 'The change could not be saved.';
  return (
    <div role="alert" data-testid="save-problem" className="rounded-xl border border-eol-600/30 bg-eol-600/5 p-4 text-sm text-tide-900">
      <p className="font-bold text-eol-600">{stale ? `Someone else changed this ${what} first` : 'Not saved'}</p>
      <p className="mt-1">{message}</p>
      {stale && onReload ? (
        <Button size="sm" className="mt-3" onClick={onReload}>
          Load their version (your edits are dropped)
        </Button>
      ) : null}
    </div>
  );
}

/** Save and cancel, at the end of every register form. */
export function FormActions({ saving, saveLabel = 'Save', onCancel }: { saving: boolean; saveLabel?: string; onCancel: () => void }) {
  return (
    <div className="flex flex-wrap gap-2 border-t border-tide-100 pt-4">
      <Button type="submit" variant="primary" disabled={saving}>
        {saving ? 'Saving…' : saveLabel}
      </Button>
      <Button onClick={onCancel} disabled={saving}>
        Cancel
      </Button>
    </div>
  );
}
