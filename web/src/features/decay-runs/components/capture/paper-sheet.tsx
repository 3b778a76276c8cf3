import { useId, useMemo, useState } from 'react';
import type { BankEngineInputs, DecaySample } from '../../../../../../shared/domain';
import { Button } from '../../../../components/ui/button';
import { Field, TextInput } from '../../../../components/ui/field';
import { leftOutRows, type LeftOutMark } from '../../utils/left-out-rows';
import {
  EMPTY_READING_ROW,
  readReadingRows,
  withCell,
  withoutRow,
  type ReadingRow,
} from '../../utils/readings';
import { DecayPlot } from '../decay-plot';
import { ReadingsTable } from '../readings-table';
import { liveFit } from './live-fit';


/**
 * Readings typed afterwards from a paper sheet: time since isolation and voltage per row (the
 * decay check's table), the time of day of the isolation, the chart with the live fit, and
 * "Use these readings". Every change goes to the parent (the draft) at once.
 */
export function PaperSheet({
  engine,
  samples,
  isolatedAt,
  onSamples,
  onIsolatedAt,
  onDone,
}: {
  engine: BankEngineInputs | null;
  /** The readings kept so far (a resumed draft), in time order. */
  samples: readonly DecaySample[];
  /** The moment of isolation, UTC ISO (the time of the safety confirmation until changed). */
  isolatedAt: string;
  onSamples: (samples: DecaySample[]) => void;
  onIsolatedAt: (isolatedAt: string) => void;
  onDone: () => void;
}) {
  const [rows, setRows] = useState<ReadingRow[]>(() => [
    ...samples.map((s) => ({ time: String(s.tSeconds), volts: String(s.volts) })),
    ...Array.from({ length: Math.max(1, 4 - samples.length) }, () => EMPTY_READING_ROW),
  ]);
  const readings = useMemo(() => readReadingRows(rows), [rows]);
  const fit = useMemo(() => liveFit(readings.samples, engine), [readings.samples, engine]);
  const leftOut = useMemo(() => {
    if (fit.verdict?.status !== 'ok') return new Map<number, LeftOutMark>();
    // the fit's indices count in the time-ordered readings; map them back to screen rows
    const order = readings.samples
      .map((s, i) => ({ s, row: readings.rowNumbers[i]! }))
      .sort((a, b) => a.s.tSeconds - b.s.tSeconds);
    return leftOutRows(
      fit.verdict.fit.excluded,
      order.map((o) => o.row),
    );
  }, [fit, readings]);
  const timeId = useId();

  function change(next: ReadingRow[]) {
    setRows(next);
    const read = readReadingRows(next);
    onSamples([...read.samples].sort((a, b) => a.tSeconds - b.tSeconds));
  }

  return (
    <div className="space-y-4" data-testid="paper-sheet">
      <p className="text-base text-tide-900">
        Type the readings from your sheet: seconds (or m:ss) since isolation and the voltage.
      </p>
      <Field
        id={timeId}
        label="Time of isolation"
        hint="The time of day the drive was isolated: the sheet’s 0 s."
      >
        <TextInput
          id={timeId}
          type="time"
          step={1}
          className="min-h-12"
          value={timeOfDay(isolatedAt)}
          onChange={(e) => {
            const next = withTimeOfDay(isolatedAt, e.target.value);
            if (next) onIsolatedAt(next);
          }}
        />
      </Field>
      <ReadingsTable
        rows={rows}
        issues={readings.issues}
        leftOut={leftOut}
        onCell={(index, field, value) => change(withCell(rows, index, field, value))}
        onRemove={(index) => change(withoutRow(rows, index))}
      />
      {fit.plotted.length > 0 ? (
        <DecayPlot samples={fit.plotted} verdict={fit.fit ? { fit: fit.fit } : null} />
      ) : null}
      {fit.fit === null && fit.plotted.length >= 3 ? (
        <p className="text-sm text-tide-800">
          These readings do not fit a decay yet: check the times and the voltages.
        </p>
      ) : null}
      <Button
        variant="primary"
        className="min-h-12 w-full text-base sm:w-auto"
        disabled={readings.samples.length < 3}
        onClick={onDone}
      >
        Use these readings
      </Button>
      {readings.samples.length < 3 ? (
        <p className="text-sm text-tide-800">
          At least 3 readings; better 5 or more over two to three time constants.
        </p>
      ) : null}
    </div>
  );
}

/** "HH:MM:SS" of an instant on this phone's clock. */
function timeOfDay(iso: string): string {
  const d = new Date(iso);
  return [d.getHours(), d.getMinutes(), d.getSeconds()]
    .map((n) => String(n).padStart(2, '0'))
    .join(':');
}

/** The instant at `time` ("HH:MM" or "HH:MM:SS", this phone's clock) on the day of `iso`; a time after now is the day before. */
function withTimeOfDay(iso: string, time: string): string | null {
  const match = /^(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(time);
  if (!match) return null;
  const d = new Date(iso);
  d.setHours(Number(match[1]), Number(match[2]), Number(match[3] ?? 0), 0);
  if (d.getTime() > Date.now()) d.setDate(d.getDate() - 1);
  return d.toISOString();
}
