import { useDeferredValue, useMemo, useState } from 'react';
import { bankEngineInputs } from '../../../../../shared/domain';
import type { Bank } from '../../../../../shared/schemas/bank';
import {
  EMPTY_READING_ROW,
  readConditions,
  readReadingRows,
  withCell,
  withoutRow,
  type ConditionInputs,
  type ReadingRow,
} from '../utils/readings';
import { runDecayCheck } from '../utils/run-check';

const FIRST_ROWS = 4;

/**
 * The state of one decay check on one bank: the readings and conditions as typed, and the
 * engine's answer for them, recomputed as they change. Nothing is stored.
 */
export function useDecayCheck(bank: Bank) {
  const [rows, setRows] = useState<ReadingRow[]>(() => Array.from({ length: FIRST_ROWS }, () => EMPTY_READING_ROW));
  const [inputs, setInputs] = useState<ConditionInputs>({ bankTempC: '', meterInputMegohms: '', measuredBleederKilohms: '' });
  const facts = useMemo(() => bankEngineInputs(bank), [bank]);
  // a fast typist is never held up by the fit
  const typedRows = useDeferredValue(rows);
  const typedInputs = useDeferredValue(inputs);
  const readings = useMemo(() => readReadingRows(typedRows), [typedRows]);
  const conditions = useMemo(() => readConditions(typedInputs), [typedInputs]);
  const outcome = useMemo(
    () => (facts ? runDecayCheck(facts, readings, conditions.conditions) : null),
    [facts, readings, conditions],
  );

  /** Changes one cell; typing into the last row opens a new one below it. */
  function setCell(index: number, field: keyof ReadingRow, value: string) {
    setRows((current) => withCell(current, index, field, value));
  }

  function removeRow(index: number) {
    setRows((current) => withoutRow(current, index));
  }

  /** Puts pasted rows in place of the table, with an empty row to go on typing. */
  function replaceRows(next: ReadingRow[]) {
    setRows([...next, EMPTY_READING_ROW]);
  }

  function clearRows() {
    setRows(Array.from({ length: FIRST_ROWS }, () => EMPTY_READING_ROW));
  }

  function setInput(field: keyof ConditionInputs, value: string) {
    setInputs((current) => ({ ...current, [field]: value }));
  }

  return { facts, rows, inputs, readings, conditionIssues: conditions.issues, outcome, setCell, removeRow, replaceRows, clearRows, setInput };
}
