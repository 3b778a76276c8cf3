import { estimateVisitMinutes } from '../../../../shared/domain/visit-duration';
import type { Visit as VisitJson } from '../../../../shared/schemas/visit';
import type { Visit } from '../../models/visit';

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** A visit as the API returns it; the query includes its cabinet, area, site, banks and technicians. */
export function presentVisit(visit: Visit): VisitJson {
  const cabinet = visit.cabinet;
  const area = cabinet?.area;
  const site = area?.site;
  const banks = [...(visit.banks ?? [])].sort((a, b) => a.position.localeCompare(b.position, 'en', { numeric: true }));
  const technicians = [...(visit.technicians ?? [])].sort((a, b) => a.name.localeCompare(b.name));
  const markedWaitMinutes = cabinet?.markedWaitMinutes ?? null;
  return {
    id: visit.id,
    cabinetId: visit.cabinetId,
    cabinetTag: cabinet?.tag ?? '',
    ...(cabinet?.location ? { cabinetName: cabinet.location } : {}),
    siteId: site?.id ?? '',
    siteName: site?.name ?? '',
    timeZone: site?.timeZone ?? 'UTC',
    areaId: area?.id ?? '',
    areaName: area?.name ?? '',
    plannedStartAt: visit.plannedStartAt.toISOString(),
    plannedEndAt: visit.plannedEndAt.toISOString(),
    state: visit.state,
    unplanned: visit.unplanned,
    notes: visit.notes,
    overrides: visit.overrides,
    stateReason: visit.stateReason,
    startedAt: iso(visit.startedAt),
    loggedAt: iso(visit.loggedAt),
    reviewedAt: iso(visit.reviewedAt),
    missedAt: iso(visit.missedAt),
    cancelledAt: iso(visit.cancelledAt),
    banks: banks.map((bank) => ({
      id: bank.id,
      position: bank.position,
      bankDesignCode: bank.bankDesign?.code ?? '',
      baselineTauSeconds: bank.baselineTauSeconds,
      lastTauSeconds: visit.decayRunFigures?.get(bank.id)?.lastTauSeconds ?? null,
      runCount: visit.decayRunFigures?.get(bank.id)?.runCount ?? 0,
    })),
    technicians: technicians.map((t) => ({ id: t.id, name: t.name })),
    cabinetMarkedWaitMinutes: markedWaitMinutes,
    estimatedMinutes: estimateVisitMinutes(banks, { markedWaitMinutes }),
    version: visit.version,
    createdAt: visit.createdAt.toISOString(),
    updatedAt: visit.updatedAt.toISOString(),
  };
}
