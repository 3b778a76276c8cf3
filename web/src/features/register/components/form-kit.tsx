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
  // questions, not errors: FieldQuestion shows them beside their fields
  if (error.code === CONFIRMATION_NEEDED) return issuesAllOnFields(error, fields);
  let placed = 0;
  for (const issue of error.issues) {
    if (fields.includes(issue.path)) {
      setError(issue.path as Path<T>, { type: 'server', message: issue.message });
      placed += 1;
    }
  }
  return placed === error.issues.length;
}

/** The API's answer to a save holding unlikely values the person has not confirmed yet. */
const CONFIRMATION_NEEDED = 'confirmation-needed';

/**
 * The questions of a save the API wants confirmed ("are you sure?"), by field; empty for any
 * other outcome.
 */
export function unlikelyQuestions(error: unknown): Partial<Record<string, string>> {
  if (!(error instanceof ApiError) || error.code !== CONFIRMATION_NEEDED) return {};
  return Object.fromEntries(error.issues.map((i) => [i.path, i.message]));
}

/**
 * "Are you sure?" beside a field whose value is unlikely (a DC bus far from the supply's, a
 * date years ahead): the person corrects the field, or keeps the value with "Save anyway".
 */
export function FieldQuestion({
  id,
  question,
  saving,
  onSaveAnyway,
}: {
  id: string;
  question: string | undefined;
  saving: boolean;
  onSaveAnyway: () => void;
}) {
  if (!question) return null;
  return (
    <div role="alert" data-testid={`question-${id}`} className="mt-2 rounded-lg border border-watch-600/40 bg-spark-300/15 p-3 text-sm text-tide-900">
      <p className="font-bold text-watch-600">Are you sure?</p>
      <p className="mt-1">{question}</p>
      <Button size="sm" className="mt-2" disabled={saving} onClick={onSaveAnyway}>
        Save anyway
      </Button>
    </div>
  );
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
