/** The columns of each register record kept in the audit trail's before/after snapshots. */
import type { Area } from '../models/area';
import type { Bank } from '../models/bank';
import type { Cabinet } from '../models/cabinet';
import type { Site } from '../models/site';
import type { Spare } from '../models/spare';
import { auditedColumns } from './audited-change';

export const SITE_AUDITED = ['name', 'code', 'address', 'timeZone', 'version', 'retiredAt'] as const;

export const AREA_AUDITED = ['siteId', 'name', 'description', 'version', 'retiredAt'] as const;

export const CABINET_AUDITED = [
  'areaId',
  'tag',
  'location',
  'driveMake',
  'driveModel',
  'supplyVolts',
  'dcBusVolts',
  'ratedPowerKilowatts',
  'markedWaitMinutes',
  'criticality',
  'environmentNotes',
  'commissionedOn',
  'status',
  'version',
  'retiredAt',
] as const;

export const BANK_AUDITED = [
  'cabinetId',
  'bankDesignId',
  'position',
  'serialNumber',
  'installedOn',
  'notes',
  'status',
  'baselineTauSeconds',
  'baselineCapacitanceMicrofarads',
  'baselineSource',
  'baselineSetAt',
  'baselineSetById',
  'baselineDesignVersionId',
  'baselineDecayRunId',
  'baselineNote',
  'replacesBankId',
  'replacedByBankId',
  'replacedOn',
  'version',
  'retiredAt',
] as const;

export const BANK_DESIGN_AUDITED = ['code', 'name', 'notes', 'currentVersionId', 'version', 'retiredAt'] as const;

export const SPARE_AUDITED = [
  'code',
  'kind',
  'description',
  'siteId',
  'bankDesignId',
  'storageLocation',
  'storageStartedOn',
  'lastReformedOn',
  'reformingIntervalDays',
  'reformingDueOn',
  'status',
  'notes',
  'version',
  'retiredAt',
] as const;

/** Each record kind as the audit trail keeps it (a bank design adds its revision: see bank-designs). */
export const SITE_TRAIL = auditedColumns<Site>('site', SITE_AUDITED);
export const AREA_TRAIL = auditedColumns<Area>('area', AREA_AUDITED);
export const CABINET_TRAIL = auditedColumns<Cabinet>('cabinet', CABINET_AUDITED);
export const BANK_TRAIL = auditedColumns<Bank>('bank', BANK_AUDITED);
export const SPARE_TRAIL = auditedColumns<Spare>('spare', SPARE_AUDITED);
