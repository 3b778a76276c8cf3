import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import type { LeftOutMark } from '../utils/left-out-rows';
import type { ReadingIssue, ReadingRow } from '../utils/readings';

/**
 * The readings table of a decay run typed by hand (the bank's decay check, a paper sheet at the
 * cabinet): one row per reading, time since isolation and DC-bus voltage, each cell with its own
 * label and message, rows the engine left out marked with the reason.
 */
export function ReadingsTable({
  rows,
  issues,
  leftOut,
  onCell,
  onRemove,
}: {
  rows: readonly ReadingRow[];
  issues: readonly ReadingIssue[];
  /** Rows whose reading the engine left out, with their mark and explanation. */
  leftOut: ReadonlyMap<number, LeftOutMark>;
  onCell: (index: number, field: keyof ReadingRow, value: string) => void;
  onRemove: (index: number) => void;
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium text-tide-900">Readings</legend>
      <div
        className="grid grid-cols-[2rem_1fr_1fr_2.5rem] items-end gap-x-2 text-xs font-bold uppercase tracking-wide text-tide-600"
        aria-hidden="true"
      >
        <span>Row</span>
        <span>Time since isolation (s)</span>
        <span>DC bus (V)</span>
        <span />
      </div>
      <ol className="mt-1 space-y-1.5">
        {rows.map((row, i) => {
          const n = i + 1;
          const rowIssues = issues.filter((issue) => issue.row === n);
          const bad = (field: ReadingIssue['field']) =>
            rowIssues.some((issue) => issue.field === field);
          const errorId = `reading-${n}-error`;
          const mark = leftOut.get(n);
          const markId = `reading-${n}-left-out`;
          const describedBy =
            [rowIssues.length ? errorId : '', mark ? markId : ''].filter(Boolean).join(' ') ||
            undefined;
          return (
            <li key={i} data-testid={`reading-row-${n}`} data-left-out={mark ? 'true' : undefined}>
              <div
                className={`grid grid-cols-[2rem_1fr_1fr_2.5rem] items-center gap-x-2 ${mark ? '-mx-1 rounded-md bg-watch-600/10 px-1 py-0.5' : ''}`}
              >
                <span
                  className={`text-right font-mono text-sm ${mark ? 'font-bold text-watch-600' : 'text-tide-600'}`}
                >
                  {n}
                </span>
                <ReadingCell
                  id={`reading-${n}-time`}
                  label={`Row ${n}: time since isolation, seconds`}
                  value={row.time}
                  invalid={bad('time')}
                  describedBy={describedBy}
                  onChange={(value) => onCell(i, 'time', value)}
                />
                <ReadingCell
                  id={`reading-${n}-volts`}
                  label={`Row ${n}: DC-bus voltage, volts`}
                  value={row.volts}
                  invalid={bad('volts')}
                  describedBy={describedBy}
                  onChange={(value) => onCell(i, 'volts', value)}
                />
                <Button
                  variant="ghost"
                  size="sm"
                  className="px-0"
                  aria-label={`Remove row ${n}`}
                  onClick={() => onRemove(i)}
                >
                  ✕
                </Button>
              </div>
              {rowIssues.length ? (
                <div
                  id={errorId}
                  data-testid={`error-reading-${n}`}
                  className="ml-10 mt-0.5 space-y-0.5 text-sm font-medium text-eol-600"
                >
                  {rowIssues.map((issue) => (
                    <p key={issue.field + issue.message}>{issue.message}</p>
                  ))}
                </div>
              ) : null}
              {mark ? (
                <div
                  id={markId}
                  data-testid={`left-out-reading-${n}`}
                  className="ml-10 mt-0.5 text-sm text-tide-900"
                >
                  <span className="mr-1 inline-flex rounded-full bg-watch-600/15 px-2 py-0.5 text-xs font-bold text-watch-600">
                    {mark.label}
                  </span>
                  {mark.explanation}
                </div>
              ) : null}
            </li>
          );
        })}
      </ol>
      <p className="mt-1 text-xs text-tide-600">
        Seconds (or m:ss) from the moment of isolation; a new row opens as you type in the last one.
      </p>
    </fieldset>
  );
}

/** One cell of a reading: a decimal input with its own (screen-reader) label. */
function ReadingCell(props: {
  id: string;
  label: string;
  value: string;
  invalid: boolean;
  describedBy: string | undefined;
  onChange: (value: string) => void;
}) {
  return (
    <div>
      <label htmlFor={props.id} className="sr-only">
        {props.label}
      </label>
      <input
        id={props.id}
        className={inputClass}
        inputMode="decimal"
        autoComplete="off"
        value={props.value}
        aria-invalid={props.invalid || undefined}
        aria-describedby={props.describedBy}
        onChange={(e) => props.onChange(e.target.value)}
      />
    </div>
  );
}
