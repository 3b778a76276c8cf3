import { useId, useState } from 'react';
import { SAFETY_CHECKS, type SafetyCheckKey } from '../../../../../../shared/constants/decay-runs';
import { estimateDischargeSafety } from '../../../../../../shared/domain/discharge-safety';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import { DischargeCaution } from '../../../../components/ui/discharge-caution';
import { expectedTauOf, waitText } from './capture-facts';
import { StepActions } from './step-actions';

/** The checks of the gate: every safety check confirmed before the capture (absence of voltage comes at the end). */
export const GATE_CHECKS = SAFETY_CHECKS.filter((check) => check.when === 'before');

/** The gate's confirmation: the four checks, each true, and when they were confirmed. */
export interface GateConfirmation {
  qualifiedPerson: true;
  lockoutTagoutApplied: true;
  meterRatedAndProved: true;
  meterOnTestPoints: true;
  /** UTC ISO instant of the confirmation. */
  confirmedAt: string;
}

/**
 * The safety gate before any reading of a bank: the cabinet's marked wait, Ebbline's estimate
 * of the discharge from the bank's τ (never a permission to touch), the cautions, and the four
 * checks the technician confirms one by one. Continue only when all four are ticked.
 *
 * @param busVolts - the cabinet's nominal DC-bus voltage, volts, when the register has it
 */
export function SafetyGate({
  visit,
  bank,
  busVolts,
  onConfirm,
  onCancel,
}: {
  visit: Pick<Visit, 'cabinetTag' | 'cabinetMarkedWaitMinutes'>;
  bank: VisitBankRef;
  busVolts?: number;
  onConfirm: (confirmation: GateConfirmation) => void;
  onCancel?: () => void;
}) {
  const [ticked, setTicked] = useState<ReadonlySet<SafetyCheckKey>>(new Set());
  const all = GATE_CHECKS.every((check) => ticked.has(check.key));
  const headingId = useId();

  function toggle(key: SafetyCheckKey, on: boolean) {
    setTicked((current) => {
      const next = new Set(current);
      if (on) next.add(key);
      else next.delete(key);
      return next;
    });
  }

  return (
    <section aria-labelledby={headingId} className="space-y-4" data-testid="safety-gate">
      <h3 id={headingId} className="text-lg font-bold text-tide-900">
        Safety first: {bank.position}
      </h3>
      <DischargeTimes visit={visit} bank={bank} busVolts={busVolts} />
      <DischargeCaution compact />
      <fieldset className="space-y-2">
        <legend className="mb-2 text-base font-bold text-tide-900">
          Confirm each of these before you measure
        </legend>
        {GATE_CHECKS.map((check) => (
          <BigCheck
            key={check.key}
            label={check.sentence}
            checked={ticked.has(check.key)}
            onChange={(on) => toggle(check.key, on)}
          />
        ))}
      </fieldset>
      {!all ? (
        <p className="text-sm text-tide-800" data-testid="gate-waiting">
          Tick all {GATE_CHECKS.length} to go on ({ticked.size} of {GATE_CHECKS.length} ticked). If
          one is not true, stop here and put it right first.
        </p>
      ) : null}
      <StepActions
        next={{
          label: 'Continue to the readings',
          disabled: !all,
          onClick: () =>
            onConfirm({
              qualifiedPerson: true,
              lockoutTagoutApplied: true,
              meterRatedAndProved: true,
              meterOnTestPoints: true,
              confirmedAt: new Date(Date.now()).toISOString(),
            }),
        }}
        back={onCancel ? { label: 'Not now', onClick: onCancel } : undefined}
      />
    </section>
  );
}

/** A checkbox a gloved thumb can hit: the whole row is the target. */
export function BigCheck({
  label,
  checked,
  onChange,
}: {
  label: string;
  checked: boolean;
  onChange: (checked: boolean) => void;
}) {
  return (
    <label
      className={`flex min-h-14 cursor-pointer items-start gap-3 rounded-lg border-2 px-3 py-3 text-base ${
        checked
          ? 'border-ok-600 bg-ok-600/5 text-tide-950'
          : 'border-tide-200 bg-white text-tide-900'
      }`}
    >
      <input
        type="checkbox"
        className="mt-0.5 size-6 shrink-0 accent-ok-600"
        checked={checked}
        onChange={(e) => onChange(e.target.checked)}
      />
      <span>{label}</span>
    </label>
  );
}

/** The marked wait and the engine's estimate of the discharge, side by side. */
function DischargeTimes({
  visit,
  bank,
  busVolts,
}: {
  visit: Pick<Visit, 'cabinetMarkedWaitMinutes'>;
  bank: VisitBankRef;
  busVolts?: number;
}) {
  const expected = expectedTauOf(bank);
  const marked =
    visit.cabinetMarkedWaitMinutes !== null && visit.cabinetMarkedWaitMinutes > 0
      ? visit.cabinetMarkedWaitMinutes * 60
      : undefined;
  const estimate =
    busVolts !== undefined && busVolts > 0
      ? estimateDischargeSafety({
          busTauSeconds: expected.tauSeconds,
          fromVolts: busVolts,
          fromSource: 'nominal-bus',
          markedWaitSeconds: marked,
        })
      : null;
  const tauFrom =
    expected.source === 'last run'
      ? 'its last accepted run'
      : expected.source === 'baseline'
        ? 'its baseline'
        : 'a typical bank';
  return (
    <div className="space-y-2" data-testid="gate-discharge">
      <dl className="grid grid-cols-1 gap-2 sm:grid-cols-2">
        <div className="rounded-lg border border-tide-100 bg-tide-50 px-3 py-2">
          <dt className="text-xs font-bold uppercase tracking-wide text-tide-600">
            Marked wait on the cabinet
          </dt>
          <dd className="text-lg font-bold text-tide-950" data-testid="gate-marked-wait">
            {marked !== undefined ? `${visit.cabinetMarkedWaitMinutes} min` : 'Not on record'}
          </dd>
          <dd className="text-sm text-tide-800">
            {marked !== undefined
              ? 'Wait at least this long after isolating before you open the cabinet.'
              : 'Read the wait time on the drive’s label or in its manual, and wait at least that long.'}
          </dd>
        </div>
        <div className="rounded-lg border border-tide-100 bg-tide-50 px-3 py-2">
          <dt className="text-xs font-bold uppercase tracking-wide text-tide-600">
            Ebbline’s estimate
          </dt>
          <dd className="text-lg font-bold text-tide-950" data-testid="gate-estimate">
            {estimate
              ? `about ${waitText(estimate.safeAfterSeconds['50'])} to 50 V`
              : `about ${waitText(5 * expected.tauSeconds)} to under 1 %`}
          </dd>
          <dd className="text-sm text-tide-800">
            From τ = {Math.round(expected.tauSeconds)} s of {tauFrom}
            {estimate
              ? ` and the ${Math.round(busVolts!)} V bus.`
              : ' (5 time constants; the bus voltage is not on record).'}
          </dd>
        </div>
      </dl>
      {estimate?.findings.map((finding) => (
        <p
          key={finding}
          className="rounded-lg border border-eol-600/40 bg-eol-600/5 px-3 py-2 text-sm font-medium text-eol-600"
          role="alert"
        >
          ⚠ {finding}
        </p>
      ))}
      <p className="text-sm text-tide-800">
        Whichever is longer counts. The estimate never replaces the marked wait or your meter.
      </p>
    </div>
  );
}
