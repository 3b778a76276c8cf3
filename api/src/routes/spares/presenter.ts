import type { Spare as SpareJson } from '../../../../shared/schemas/spare';
import type { Spare } from '../../models/spare';
import { todayUtc } from '../../services/spares';

/** A spare as the API returns it; `asOf` decides whether its reforming is overdue. */
export function presentSpare(spare: Spare, asOf = todayUtc(new Date())): SpareJson {
  return {
    id: spare.id,
    code: spare.code,
    kind: spare.kind,
    description: spare.description,
    siteId: spare.siteId,
    siteName: spare.site?.name ?? '',
    bankDesignId: spare.bankDesignId,
    bankDesignCode: spare.bankDesign?.code ?? null,
    storageLocation: spare.storageLocation,
    storageStartedOn: spare.storageStartedOn,
    lastReformedOn: spare.lastReformedOn,
    reformingIntervalDays: spare.reformingIntervalDays,
    reformingDueOn: spare.reformingDueOn,
    reformingOverdue: spare.reformingDueOn < asOf,
    status: spare.status,
    notes: spare.notes,
    version: spare.version,
    retiredAt: spare.retiredAt ? spare.retiredAt.toISOString() : null,
    createdAt: spare.createdAt.toISOString(),
    updatedAt: spare.updatedAt.toISOString(),
  };
}
