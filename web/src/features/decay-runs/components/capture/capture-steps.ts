/** Where a run in progress stands (its step), kept on this phone beside its draft so a reload resumes there (localStorage). */
import type { RunDraft } from '../../drafts/draft-store';

/** The steps of a run after the safety gate. */
export type Step = 'method' | 'guided' | 'typed' | 'logger' | 'finish';

export interface StepState {
  step: Step;
  /** The guided capture has ended (a reading below 50 V, or Stop). */
  ended: boolean;
}

const STEP_KEY = (clientId: string) => `ebbline-capture-step:${clientId}`;

/** The step a run was at when last seen on this phone, else worked out from its draft (readings taken → their method). */
export function loadStep(draft: RunDraft): StepState {
  try {
    const stored = JSON.parse(
      localStorage.getItem(STEP_KEY(draft.clientId)) ?? 'null',
    ) as StepState | null;
    if (stored && typeof stored.step === 'string') return stored;
  } catch {
    // nothing kept: work it out from the draft
  }
  const source = draft.body.source;
  if (draft.body.samples?.length || (source === 'guided' && draft.body.isolatedAt))
    return { step: source ?? 'guided', ended: false };
  return { step: 'method', ended: false };
}

/** Forgets a run's step once it is sent. */
export function forgetStep(clientId: string): void {
  try {
    localStorage.removeItem(STEP_KEY(clientId));
  } catch {
    // nothing kept
  }
}

/** Keeps a run's step on this phone, so a reload or a closed tab reopens it there. */
export function saveStep(clientId: string, state: StepState): void {
  try {
    localStorage.setItem(STEP_KEY(clientId), JSON.stringify(state));
  } catch {
    // private mode: the step is worked out from the draft after a reload
  }
}
