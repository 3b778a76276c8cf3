import type { DecayRun } from '../../../../../../shared/schemas/decay-run';

/**
 * A correction of a stored run: the readings and observations to edit, and the required reason.
 * Stored as the run's next version; `onCorrected` gets the new version.
 */
export function CorrectionForm({
  run,
  onCorrected,
  onCancel,
}: {
  run: DecayRun;
  onCorrected?: (next: DecayRun) => void;
  onCancel?: () => void;
}) {
  void onCorrected;
  void onCancel;
  return <form data-testid="correction-form">Correct version {run.version}</form>;
}
