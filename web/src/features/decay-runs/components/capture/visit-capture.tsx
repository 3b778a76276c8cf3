import type { Role } from '../../../../../../shared/constants/roles';
import type { Visit } from '../../../../../../shared/schemas/visit';

/** Who is looking at the visit. */
export interface CaptureViewer {
  id: string;
  roles: readonly Role[];
}

/**
 * The work at the cabinet for one visit: each bank with its state, and per bank the safety
 * gate, the readings (guided, from a paper sheet, or a logger file), the observations, the
 * save and the verdict.
 */
export function VisitCapture({ visit }: { visit: Visit; viewer: CaptureViewer }) {
  return (
    <section aria-label="Decay runs" data-testid="visit-capture">
      {visit.banks.length} banks
    </section>
  );
}

/** In the "Mark as logged" confirmation: the banks of the visit with no run sent yet. */
export function UnsentRunsWarning({ visit }: { visit: Visit }) {
  void visit;
  return null;
}
