import {
  bankRatedVolts,
  type BankDesign as BankDesignJson,
  type BankDesignRevision,
} from '../../../../shared/schemas/bank-design';
import type { BankDesign } from '../../models/bank-design';
import type { BankDesignVersion } from '../../models/bank-design-version';
import { revisionFieldsOf } from '../../services/bank-designs';
import { nameplateBaseline } from '../../services/banks';

function nominal(version: BankDesignVersion) {
  const { capacitanceMicrofarads, tauSeconds } = nameplateBaseline(version);
  return { nominalCapacitanceMicrofarads: capacitanceMicrofarads, nominalTauSeconds: tauSeconds };
}

/** A design with its current revision's fields, as the API returns it. */
export function presentBankDesign(design: BankDesign): BankDesignJson {
  const current = design.currentVersion;
  if (!current) throw new Error(`bank design ${design.id} was loaded without its current revision`);
  return {
    id: design.id,
    code: design.code,
    name: design.name,
    notes: design.notes,
    revision: current.revision,
    revisionId: current.id,
    ...revisionFieldsOf(current),
    ...nominal(current),
    bankRatedVolts: bankRatedVolts(current.unitRatedVolts, current.seriesCount),
    bankCount: Number(design.get('bankCount') ?? 0),
    version: design.version,
    retiredAt: design.retiredAt ? design.retiredAt.toISOString() : null,
    createdAt: design.createdAt.toISOString(),
    updatedAt: design.updatedAt.toISOString(),
  };
}

/** One revision as the API returns it. */
export function presentBankDesignRevision(version: BankDesignVersion): BankDesignRevision {
  return {
    id: version.id,
    revision: version.revision,
    ...revisionFieldsOf(version),
    ...nominal(version),
    changeNote: version.changeNote,
    createdAt: version.createdAt.toISOString(),
    createdBy: version.createdBy ? { id: version.createdBy.id, name: version.createdBy.name } : null,
  };
}
