/** The columns of each register record kept in the audit trail's before/after snapshots. */

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
