import type { ExcludedReading } from '../../../../../shared/domain';

/** How one row of the readings table is marked when the engine left its reading out. */
export interface LeftOutMark {
  /** Short words on the row: "left out" or "left out · control-supply phase". */
  label: string;
  /** The one explanation, under this row; null when it stands under another row of the same phase. */
  explanation: string | null;
}

/**
 * The marks of the rows whose readings the fit left out, by screen row. A mistyped reading is
 * explained under its own row; the readings of a control-supply phase share one explanation,
 * under the last of them, so nothing is said twice.
 *
 * @param excluded - the fit's left-out readings (sample indices)
 * @param rowNumbers - screen row of each sample
 * @example
 * leftOutRows([{ index: 3, code: 'typing-slip', reason: 'The reading 24.2 V …' }], [1, 2, 3, 4, 5])
 * // Map { 4 => { label: 'left out', explanation: 'The reading 24.2 V …' } }
 */
export function leftOutRows(excluded: readonly ExcludedReading[], rowNumbers: readonly number[]): Map<number, LeftOutMark> {
  const rowOf = (index: number) => rowNumbers[index] ?? index + 1;
  const marks = new Map<number, LeftOutMark>();
  const phase = excluded.filter((e) => e.code === 'control-supply-phase');
  for (const [i, e] of phase.entries()) {
    const last = i === phase.length - 1;
    const rows = phase.length === 1 ? `Row ${rowOf(e.index)}` : `Rows ${rowOf(phase[0]!.index)}–${rowOf(e.index)}`;
    marks.set(rowOf(e.index), { label: 'left out · control-supply phase', explanation: last ? `${rows} left out: ${e.reason}` : null });
  }
  for (const e of excluded) {
    if (e.code !== 'control-supply-phase') marks.set(rowOf(e.index), { label: 'left out', explanation: e.reason });
  }
  return marks;
}
