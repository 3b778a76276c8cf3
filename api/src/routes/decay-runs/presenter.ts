import type { DecayRun as DecayRunJson } from '../../../../shared/schemas/decay-run';
import type { DecayRun } from '../../models/decay-run';

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/**
 * A decay run as the API returns it. The run must be loaded with its bank (→ cabinet → area →
 * site), the people and its correction (`loadDecayRun` and the list services do).
 */
export function presentDecayRun(run: DecayRun): DecayRunJson {
  const bank = run.bank;
  const cabinet = bank?.cabinet;
  const site = cabinet?.area?.site;
  return {
    id: run.id,
    clientId: run.clientId,
    visitId: run.visitId,
    bankId: run.bankId,
    bankPosition: bank?.position ?? '',
    cabinetId: cabinet?.id ?? '',
    cabinetTag: cabinet?.tag ?? '',
    siteId: site?.id ?? '',
    siteName: site?.name ?? '',
    version: run.version,
    supersedesId: run.supersedesId,
    supersededById: run.supersededBy?.id ?? null,
    correctionReason: run.correctionReason,
    source: run.source,
    loggerFileName: run.loggerFileName,
    isolatedAt: run.isolatedAt.toISOString(),
    samples: run.samples,
    safety: run.safety,
    observations: run.observations,
    verdict: run.verdict,
    health: run.health,
    tauSeconds: run.tauSeconds,
    capacitanceRatio: run.capacitanceRatio,
    safetyFinding: run.safetyFinding,
    review: {
      state: run.reviewState,
      comment: run.reviewComment,
      reviewedBy: run.reviewedBy ? { id: run.reviewedBy.id, name: run.reviewedBy.name } : null,
      reviewedAt: iso(run.reviewedAt),
    },
    usedAsBaseline: bank?.baselineDecayRunId === run.id,
    recordedBy: { id: run.recordedById, name: run.recordedBy?.name ?? '' },
    recordedAt: run.recordedAt.toISOString(),
  };
}
