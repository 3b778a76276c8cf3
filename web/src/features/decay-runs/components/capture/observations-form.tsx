import { useId, useState } from 'react';
import {
  VISUAL_FINDING_LABELS,
  VISUAL_FINDINGS,
  type VisualFinding,
} from '../../../../../../shared/constants/decay-runs';
import type { DecayRunObservations } from '../../../../../../shared/schemas/decay-run';
import { Field, TextArea, TextInput, UnitInput } from '../../../../components/ui/field';
import { formatOhms } from '../../../../lib/units';
import { readDecimal } from '../../utils/readings';

/** The observations as typed. */
interface ObservationTexts {
  bankTempC: string;
  measuredBleederKilohms: string;
  meterName: string;
  meterInputMegohms: string;
  notes: string;
  visualFindings: VisualFinding[];
}

type ObservationField = 'bankTempC' | 'measuredBleederKilohms' | 'meterInputMegohms';

/** The observations of a run, as the API takes them (`visualFindings` always present). */
export type RunObservations = Omit<DecayRunObservations, 'visualFindings'> & {
  visualFindings: VisualFinding[];
};

function textsOf(value: Partial<RunObservations> | undefined): ObservationTexts {
  const number = (n: number | null | undefined, scale = 1) =>
    n === null || n === undefined ? '' : String(Number((n / scale).toPrecision(6)));
  return {
    bankTempC: number(value?.bankTempC),
    measuredBleederKilohms: number(value?.measuredBleederOhms, 1e3),
    meterName: value?.meterName ?? '',
    meterInputMegohms: number(value?.meterInputOhms, 1e6),
    notes: value?.notes ?? '',
    visualFindings: [...(value?.visualFindings ?? [])],
  };
}

/** Reads the typed observations; a field that cannot be read is named and left out. */
function readTexts(texts: ObservationTexts): {
  observations: RunObservations;
  problems: Partial<Record<ObservationField, string>>;
} {
  const problems: Partial<Record<ObservationField, string>> = {};
  const observations: RunObservations = { visualFindings: texts.visualFindings };
  const temp = texts.bankTempC.trim();
  if (temp !== '') {
    const v = readDecimal(temp);
    if (v === null || v < -40 || v > 150)
      problems.bankTempC = 'Enter the bank temperature in °C, between −40 and 150.';
    else observations.bankTempC = v;
  }
  const bleeder = texts.measuredBleederKilohms.trim();
  if (bleeder !== '') {
    const v = readDecimal(bleeder);
    if (v === null || !(v > 0))
      problems.measuredBleederKilohms = 'Enter the measured bleeder resistance in kΩ, above 0.';
    else observations.measuredBleederOhms = v * 1e3;
  }
  const meter = texts.meterInputMegohms.trim();
  if (meter !== '') {
    const v = readDecimal(meter);
    if (v === null || !(v > 0))
      problems.meterInputMegohms =
        "Enter the meter's input resistance in MΩ, above 0 (blank for the usual 10 MΩ).";
    else observations.meterInputOhms = v * 1e6;
  }
  if (texts.meterName.trim() !== '') observations.meterName = texts.meterName.trim();
  if (texts.notes.trim() !== '') observations.notes = texts.notes.trim();
  return { observations, problems };
}

/**
 * What the technician notes beside the readings: bank temperature, the bleeder resistance
 * measured with the bus discharged, the meter and its input resistance, notes, and the visual
 * findings as big toggles (each one makes the verdict end of life and is a safety finding).
 * Every change goes to the parent at once, with the fields that cannot be read.
 *
 * @param designBleederOhms - the design's bleeder, ohms, shown beside the measured one
 */
export function ObservationsForm({
  initial,
  designBleederOhms,
  onChange,
}: {
  initial?: Partial<RunObservations>;
  designBleederOhms?: number;
  onChange: (observations: RunObservations, problems: string[]) => void;
}) {
  const [texts, setTexts] = useState<ObservationTexts>(() => textsOf(initial));
  const { problems } = readTexts(texts);
  const id = useId();

  function set(patch: Partial<ObservationTexts>) {
    const next = { ...texts, ...patch };
    setTexts(next);
    const read = readTexts(next);
    onChange(read.observations, Object.values(read.problems));
  }

  function toggle(finding: VisualFinding) {
    const on = texts.visualFindings.includes(finding);
    set({
      visualFindings: on
        ? texts.visualFindings.filter((f) => f !== finding)
        : VISUAL_FINDINGS.filter((f) => f === finding || texts.visualFindings.includes(f)),
    });
  }

  return (
    <div className="space-y-5" data-testid="observations-form">
      <fieldset className="space-y-2">
        <legend className="mb-1 text-base font-bold text-tide-900">What you see on the cans</legend>
        <p className="text-sm text-tide-800">
          Tap each one you see. Leave them all off when the cans look sound.
        </p>
        <div className="grid grid-cols-1 gap-2 sm:grid-cols-2">
          {VISUAL_FINDINGS.map((finding) => {
            const on = texts.visualFindings.includes(finding);
            return (
              <button
                key={finding}
                type="button"
                aria-pressed={on}
                onClick={() => toggle(finding)}
                className={`flex min-h-14 items-center gap-3 rounded-lg border-2 px-3 py-2 text-left text-base font-medium ${
                  on
                    ? 'border-eol-600 bg-eol-600/10 text-eol-600'
                    : 'border-tide-200 bg-white text-tide-900'
                }`}
              >
                <span aria-hidden="true" className="text-xl">
                  {on ? '⚠' : '○'}
                </span>
                <span>{capitalise(VISUAL_FINDING_LABELS[finding])}</span>
              </button>
            );
          })}
        </div>
        {texts.visualFindings.length > 0 ? (
          <p
            role="note"
            className="rounded-lg border border-eol-600/40 bg-eol-600/5 px-3 py-2 text-sm text-tide-950"
            data-testid="visual-finding-note"
          >
            <b className="text-eol-600">Safety finding.</b> A{' '}
            {texts.visualFindings.map((f) => VISUAL_FINDING_LABELS[f]).join(', ')} makes this bank{' '}
            <b>end of life</b> whatever the readings say: a damaged can may vent or burst. Keep the
            drive isolated, take a photo, and tell your planner so the bank is replaced.
          </p>
        ) : null}
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="mb-1 text-base font-bold text-tide-900">Measurements (optional)</legend>
        <Field
          id={`${id}-temp`}
          label="Bank temperature"
          hint="Read at the cans; the capacitance is compared at 20 °C."
          error={problems.bankTempC}
        >
          <UnitInput
            id={`${id}-temp`}
            unit="°C"
            className="min-h-12"
            invalid={!!problems.bankTempC}
            value={texts.bankTempC}
            onChange={(e) => set({ bankTempC: e.target.value })}
          />
        </Field>
        <Field
          id={`${id}-bleeder`}
          label="Measured bleeder resistance"
          hint={`Only with the bus discharged (absence of voltage verified), across the bus.${designBleederOhms ? ` The design says ${formatOhms(designBleederOhms)}.` : ''}`}
          error={problems.measuredBleederKilohms}
        >
          <UnitInput
            id={`${id}-bleeder`}
            unit="kΩ"
            className="min-h-12"
            invalid={!!problems.measuredBleederKilohms}
            value={texts.measuredBleederKilohms}
            onChange={(e) => set({ measuredBleederKilohms: e.target.value })}
          />
        </Field>
        <Field id={`${id}-meter`} label="Meter used" hint="Make and model, e.g. Corrand DM-40.">
          <TextInput
            id={`${id}-meter`}
            className="min-h-12"
            maxLength={120}
            value={texts.meterName}
            onChange={(e) => set({ meterName: e.target.value })}
          />
        </Field>
        <Field
          id={`${id}-meter-input`}
          label="Meter input resistance"
          hint="Leave blank for 10 MΩ, what most digital multimeters have on DC volts. Look it up in the meter's manual if unsure."
          error={problems.meterInputMegohms}
        >
          <UnitInput
            id={`${id}-meter-input`}
            unit="MΩ"
            placeholder="10"
            className="min-h-12"
            invalid={!!problems.meterInputMegohms}
            value={texts.meterInputMegohms}
            onChange={(e) => set({ meterInputMegohms: e.target.value })}
          />
        </Field>
        <Field
          id={`${id}-notes`}
          label="Notes"
          hint="Anything the reviewer should know: a rebound after the short, a can warm to the touch, …"
        >
          <TextArea
            id={`${id}-notes`}
            rows={3}
            maxLength={4000}
            value={texts.notes}
            onChange={(e) => set({ notes: e.target.value })}
          />
        </Field>
      </fieldset>
    </div>
  );
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
