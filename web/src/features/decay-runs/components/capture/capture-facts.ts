import type { BankEngineInputs } from '../../../../../../shared/domain';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import type { CaptureSnapshot } from '../../drafts/draft-store';

/** τ assumed when a bank has neither a measured τ nor a baseline τ, seconds (a mid-size drive). */
export const FALLBACK_TAU_SECONDS = 120;

/**
 * The τ a capture expects of a bank, seconds: its last accepted run's τ when it has one, else its
 * baseline τ; and where it comes from, in words.
 */
export function expectedTauOf(bank: VisitBankRef): {
  tauSeconds: number;
  source: 'last run' | 'baseline' | 'assumed';
} {
  const last = (bank as VisitBankRef & { lastTauSeconds?: number | null }).lastTauSeconds;
  if (typeof last === 'number' && last > 0 && Number.isFinite(last))
    return { tauSeconds: last, source: 'last run' };
  if (bank.baselineTauSeconds > 0 && Number.isFinite(bank.baselineTauSeconds))
    return { tauSeconds: bank.baselineTauSeconds, source: 'baseline' };
  return { tauSeconds: FALLBACK_TAU_SECONDS, source: 'assumed' };
}

/** Seconds as a running clock, "m:ss" (and "h:mm:ss" past an hour). */
export function clockText(seconds: number): string {
  const whole = Math.max(0, Math.floor(seconds));
  const h = Math.floor(whole / 3600);
  const m = Math.floor((whole % 3600) / 60);
  const s = whole % 60;
  const mm = h > 0 ? String(m).padStart(2, '0') : String(m);
  return `${h > 0 ? `${h}:` : ''}${mm}:${String(s).padStart(2, '0')}`;
}

/** A duration in words for a person waiting: "45 s", "8 min", "1 h 20 min". */
export function waitText(seconds: number): string {
  if (seconds < 90) return `${Math.round(seconds)} s`;
  const minutes = Math.ceil(seconds / 60);
  if (minutes < 120) return `${minutes} min`;
  return `${Math.floor(minutes / 60)} h ${minutes % 60} min`;
}

/**
 * What a run's capture needs of its visit and bank, kept with the draft when the run starts, so
 * the run can be continued from the phone alone (Ebbline opened again without a connection).
 */
export function captureSnapshotOf(
  visit: Pick<Visit, 'cabinetTag' | 'cabinetMarkedWaitMinutes'>,
  bank: VisitBankRef,
  engine: BankEngineInputs | null,
): CaptureSnapshot {
  return {
    cabinetTag: visit.cabinetTag,
    bankPosition: bank.position,
    markedWaitMinutes: visit.cabinetMarkedWaitMinutes,
    expectedTauSeconds: expectedTauOf(bank).tauSeconds,
    engine,
  };
}
