import type { ImportPreview } from '../../../../../shared/schemas/cabinet-import';

/**
 * The file's unlikely values (a DC bus far from the supply's, a date more than a year ahead), in
 * the words the cabinet form uses, with the box the person ticks to keep them. Separate from the
 * problems: a question does not stop the import once the values are checked.
 */
export function ImportQuestions({
  preview,
  checked,
  onCheckedChange,
}: {
  preview: ImportPreview;
  checked: boolean;
  onCheckedChange: (checked: boolean) => void;
}) {
  const count = preview.questionCount;
  return (
    <div className="overflow-x-auto rounded-xl border border-watch-600/40 bg-white" data-testid="import-questions-panel">
      <table className="w-full text-left text-sm" data-testid="import-questions">
        <caption className="bg-spark-300/15 px-4 py-2 text-left font-bold text-watch-600">
          Are you sure? {count.toLocaleString('en-GB')} unlikely value{count === 1 ? '' : 's'}
          {preview.questionsNotListed > 0 ? ` (the first ${preview.questions.length} listed)` : ''}: check {count === 1 ? 'it' : 'them'}{' '}
          against the cabinet before importing
        </caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2 sm:px-4">Row</th>
            {/* on a phone the column's name goes under the row number, so the question keeps the width */}
            <th className="hidden px-3 py-2 sm:table-cell sm:px-4">Column</th>
            <th className="px-3 py-2 sm:px-4">Question</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {preview.questions.map((q, i) => (
            <tr key={`${q.row}-${q.column}-${i}`} data-testid="import-question" data-row={q.row} data-column={q.column}>
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
      {preview.questionsNotListed > 0 ? (
        <p className="px-3 py-2 text-sm font-medium text-watch-600 sm:px-4" data-testid="import-questions-not-listed">
          …and {preview.questionsNotListed.toLocaleString('en-GB')} more not listed here (the first {preview.questions.length} are shown).
        </p>
      ) : null}
      <label className="flex min-h-11 items-center gap-3 border-t border-watch-600/20 px-3 py-2 text-sm font-medium text-tide-900 sm:px-4">
        <input
          type="checkbox"
          className="h-5 w-5 shrink-0 accent-tide-600"
          checked={checked}
          onChange={(e) => onCheckedChange(e.target.checked)}
          data-testid="import-questions-checked"
        />
        I have checked these values
      </label>
    </div>
  );
}
