import type { Bank as BankJson, BankDetail, BankLineageEntry } from '../../../../shared/schemas/bank';
import { bankCapacitanceMicrofarads } from '../../../../shared/domain/capacitance';
import type { Bank } from '../../models/bank';
import { bankRecordForEngine } from '../../services/banks';

/** A bank as the API returns it; the query includes its cabinet, area, site and design. */
export function presentBank(bank: Bank): BankJson {
  const design = bank.bankDesign;
  const current = design?.currentVersion;
  // the parts a decay run is judged with come from the one mapping the server judges with too
  const forEngine = bankRecordForEngine(bank);
  return {
    id: bank.id,
    cabinetId: bank.cabinetId,
    cabinetTag: bank.cabinet?.tag ?? '',
    siteId: bank.cabinet?.area?.siteId ?? '',
    siteName: bank.cabinet?.area?.site?.name ?? '',
    areaName: bank.cabinet?.area?.name ?? '',
    bankDesignId: bank.bankDesignId,
    bankDesignCode: design?.code ?? '',
    bankDesignName: design?.name ?? '',
    technology: forEngine.technology,
    designRevision: current?.revision ?? 0,
    nominalCapacitanceMicrofarads: current ? bankCapacitanceMicrofarads(current) : 0,
    designFigures: forEngine.designFigures,
    cabinetDcBusVolts: forEngine.cabinetDcBusVolts,
    cabinetMarkedWaitMinutes: forEngine.cabinetMarkedWaitMinutes,
    position: bank.position,
    serialNumber: bank.serialNumber,
    installedOn: bank.installedOn,
    notes: bank.notes,
    status: bank.status,
    baseline: {
      tauSeconds: bank.baselineTauSeconds,
      capacitanceMicrofarads: bank.baselineCapacitanceMicrofarads,
      source: bank.baselineSource,
      setAt: bank.baselineSetAt.toISOString(),
      setBy: bank.baselineSetBy ? { id: bank.baselineSetBy.id, name: bank.baselineSetBy.name } : null,
      designRevision: bank.baselineDesignVersion?.revision ?? null,
      decayRunId: bank.baselineDecayRunId,
      note: bank.baselineNote,
    },
    replacesBankId: bank.replacesBankId,
    replacedByBankId: bank.replacedByBankId,
    replacedOn: bank.replacedOn,
    // verdicts come with decay runs (visits); until then there is none
    latestVerdict: null,
    version: bank.version,
    retiredAt: bank.retiredAt ? bank.retiredAt.toISOString() : null,
    createdAt: bank.createdAt.toISOString(),
    updatedAt: bank.updatedAt.toISOString(),
  };
}

function presentLineageEntry(bank: Bank): BankLineageEntry {
  return {
    id: bank.id,
    bankDesignCode: bank.bankDesign?.code ?? '',
    serialNumber: bank.serialNumber,
    installedOn: bank.installedOn,
    replacedOn: bank.replacedOn,
    status: bank.status,
  };
}

/** A bank with its replacement chain, for its page. */
export function presentBankDetail(bank: Bank, lineage: Bank[]): BankDetail {
  return { ...presentBank(bank), lineage: lineage.map(presentLineageEntry) };
}
