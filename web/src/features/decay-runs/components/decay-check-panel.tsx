import { useMemo, useState } from 'react';
import type { Bank } from '../../../../../shared/schemas/bank';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field, TextArea, UnitInput } from '../../../components/ui/field';
import { formatPercentFigure, type BankEngineInputs, type DecaySample } from '../../../../../shared/domain';
import { formatMicrofarads, formatOhms, formatSeconds, formatVolts } from '../../../lib/units';
import { useDecayCheck } from '../hooks/use-decay-check';
import { seconds } from '../utils/figures';
import { leftOutRows, type LeftOutMark } from '../utils/left-out-rows';
import { readPastedReadings, type ReadingRow } from '../utils/readings';
import type { DecayCheckOutcome } from '../utils/run-check';
import { DecayVerdictView } from './decay-verdict';
import { LoggerUpload } from './logger/logger-upload';
import { ReadingsTable } from './readings-table';

/** What the check is judged with, in one paragraph, so an engineer can see where each figure comes from. */
function JudgedWith({ bank, facts }: { bank: Bank; facts: BankEngineInputs }) {
  const { design, baseline, cabinet } = facts;
  const c = design.construction;
  const k = bank.designFigures?.tempCoefficientPercentPerKelvin ?? 0;
  return (
    <p className="text-xs text-tide-600" data-testid="decay-judged-with">
      Judged with design {bank.bankDesignCode} revision {bank.designRevision}: {bank.technology}
      {c ? `, ${c.seriesCount} in series × ${c.parallelCount} in parallel of ${formatMicrofarads(c.unitCapacitanceMicrofarads)}` : ''}, bleeder{' '}
      {formatOhms(design.bleederOhms)}, {k === 0 ? 'no temperature coefficient' : `${k > 0 ? '+' : ''}${k} % per K`}; baseline{' '}
      {formatMicrofarads(baseline.capacitanceMicrofarads)} ({bank.baseline.source}); cabinet{' '}
      {cabinet.nominalBusVolts !== undefined ? `${formatVolts(cabinet.nominalBusVolts)} DC bus` : 'DC-bus voltage not recorded'},{' '}
      {cabinet.markedWaitSeconds !== undefined ? `marked wait ${formatSeconds(cabinet.markedWaitSeconds)}` : 'no marked wait time'}.
    </p>
  );
}

/** Most rows a logger file puts into the readings table (a table to read and type in): every n-th reading past it. */
const TABLE_ROWS_FROM_FILE = 2000;

/** A logger file's readings as rows of the table, at most {@link TABLE_ROWS_FROM_FILE}. */
function tableRowsOf(samples: readonly DecaySample[]): ReadingRow[] {
  const step = Math.max(1, Math.ceil(samples.length / TABLE_ROWS_FROM_FILE));
  return samples.filter((_, i) => i % step === 0).map((s) => ({ time: String(s.tSeconds), volts: String(s.volts) }));
}

function PasteBox({ onRows }: { onRows: (rows: ReadingRow[]) => void }) {
  const [text, setText] = useState('');
  const [problem, setProblem] = useState<string | undefined>();
  function use() {
    const read = readPastedReadings(text);
    if ('problem' in read) return setProblem(read.problem);
    setProblem(undefined);
    setText('');
    onRows(read.rows);
  }
  return (
    <details className="rounded-lg border border-tide-100 px-3 py-2">
      <summary className="cursor-pointer text-sm font-medium text-tide-800">Paste readings</summary>
      <div className="mt-2 space-y-2">
        <Field
          id="decay-paste"
          label="Pasted readings"
          hint="Two columns, time (s) and voltage (V), from a sheet or a note; or a logger's CSV with its header row."
          error={problem}
        >
          <TextArea id="decay-paste" rows={5} invalid={!!problem} value={text} onChange={(e) => setText(e.target.value)} className="font-mono" />
        </Field>
        <Button onClick={use} disabled={text.trim() === ''}>
          Use these readings
        </Button>
      </div>
    </details>
  );
}

/**
 * One line of the verdict under the readings, for phones, where the full verdict comes after the
 * conditions: the technician sees it change while typing.
 */
function LiveSummary({ outcome }: { outcome: DecayCheckOutcome | null }) {
  if (!outcome || outcome.kind === 'empty') return null;
  const v = outcome.kind === 'verdict' ? outcome.verdict : null;
  return (
    <p className="rounded-lg bg-tide-50 px-3 py-2 text-sm text-tide-950 lg:hidden" data-testid="decay-live-summary">
      {v ? (
        <>
          Health: <b>{v.healthLabel ?? 'not judged'}</b> · τ {seconds(v.tauSeconds)}
          {v.baseline ? ` · ${formatPercentFigure(v.baseline.ratio)} of baseline` : ''}
          {v.safetyFinding ? <b className="text-eol-600"> · ⚠ safety finding</b> : null}{' '}
        </>
      ) : (
        <>
          <b>Unusable</b> so far.{' '}
        </>
      )}
      <a href="#decay-result" className="text-tide-600 underline">
        Full verdict
      </a>
    </p>
  );
}

/**
 * The decay check of a bank: readings typed or pasted, judged live in the browser by Ebbline's
 * engine with the bank's design, baseline and cabinet. Nothing is stored.
 */
export function DecayCheckPanel({ bank }: { bank: Bank }) {
  const check = useDecayCheck(bank);
  const { facts, outcome, readings } = check;
  const conditionError = (field: keyof typeof check.inputs) => check.conditionIssues.find((i) => i.field === field)?.message;
  const leftOut = useMemo(
    () => (outcome?.kind === 'verdict' ? leftOutRows(outcome.verdict.fit.excluded, outcome.rowNumbers) : new Map<number, LeftOutMark>()),
    [outcome],
  );
  return (
    <Card title="Decay check">
      <div data-testid="decay-check" className="space-y-4">
        <p className="rounded-lg bg-tide-50 px-3 py-2 text-sm text-tide-900" data-testid="decay-not-stored">
          <b>This check is not stored.</b> It runs in your browser and is gone when you leave the page. To record a decay run, open this bank's visit
          in My visits (or start one at the cabinet): runs recorded on a visit are kept, reviewed, and listed under Decay runs above.
        </p>
        {!facts ? (
          <p className="text-sm text-tide-800">This bank's design has no revision to judge with.</p>
        ) : (
          <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
            <div className="space-y-4">
              <p className="text-sm text-tide-800">
                Type the readings of a discharge of this bank: the verdict below follows every change.
              </p>
              <ReadingsTable rows={check.rows} issues={readings.issues} leftOut={leftOut} onCell={check.setCell} onRemove={check.removeRow} />
              <LiveSummary outcome={outcome} />
              <div className="flex flex-wrap gap-2">
                <Button size="sm" onClick={check.clearRows}>
                  Clear readings
                </Button>
              </div>
              <PasteBox onRows={check.replaceRows} />
              <details className="rounded-lg border border-tide-100 px-3 py-2" data-testid="decay-logger-file">
                <summary className="cursor-pointer py-2 text-sm font-medium text-tide-800">Or read a logger file</summary>
                <div className="mt-2">
                  <LoggerUpload
                    engine={facts}
                    onUse={(samples) => check.replaceRows(tableRowsOf(samples))}
                  />
                </div>
              </details>
              <fieldset className="space-y-3">
                <legend className="mb-1 text-sm font-medium text-tide-900">Conditions (optional)</legend>
                <Field id="decay-bank-temp" label="Bank temperature" hint="Normalises the capacitance to 20 °C" error={conditionError('bankTempC')}>
                  <UnitInput
                    id="decay-bank-temp"
                    unit="°C"
                    invalid={!!conditionError('bankTempC')}
                    value={check.inputs.bankTempC}
                    onChange={(e) => check.setInput('bankTempC', e.target.value)}
                  />
                </Field>
                <Field id="decay-meter" label="Meter input resistance" hint="Blank for the usual 10 MΩ; 0 for none" error={conditionError('meterInputMegohms')}>
                  <UnitInput
                    id="decay-meter"
                    unit="MΩ"
                    placeholder="10"
                    invalid={!!conditionError('meterInputMegohms')}
                    value={check.inputs.meterInputMegohms}
                    onChange={(e) => check.setInput('meterInputMegohms', e.target.value)}
                  />
                </Field>
                <Field
                  id="decay-bleeder"
                  label="Measured bleeder resistance"
                  hint={`With the bus discharged; design value ${formatOhms(facts.design.bleederOhms)}`}
                  error={conditionError('measuredBleederKilohms')}
                >
                  <UnitInput
                    id="decay-bleeder"
                    unit="kΩ"
                    invalid={!!conditionError('measuredBleederKilohms')}
                    value={check.inputs.measuredBleederKilohms}
                    onChange={(e) => check.setInput('measuredBleederKilohms', e.target.value)}
                  />
                </Field>
              </fieldset>
              <JudgedWith bank={bank} facts={facts} />
            </div>
            <div className="min-w-0 scroll-mt-20" id="decay-result">
              {outcome?.kind === 'verdict' ? (
                <DecayVerdictView verdict={outcome.verdict} samples={readings.samples} rowNumbers={outcome.rowNumbers} />
              ) : outcome?.kind === 'unusable' ? (
                <div className="space-y-2" data-testid="decay-unusable">
                  <p className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950">
                    <b>Unusable: these readings cannot be judged yet.</b> {outcome.reason}
                  </p>
                  {readings.issues.length ? <p className="text-sm text-tide-800">Rows with a problem are not read: see the messages beside them.</p> : null}
                </div>
              ) : (
                <p className="rounded-lg border border-dashed border-tide-200 px-3 py-6 text-center text-sm text-tide-600" data-testid="decay-empty">
                  No readings yet. Type at least 3, better 5 or more over two to three time constants.
                </p>
              )}
            </div>
          </div>
        )}
      </div>
    </Card>
  );
}
