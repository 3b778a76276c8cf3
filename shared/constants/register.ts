/**
 * Names and role rules of the register: sites, areas, cabinets, banks, bank designs and spares.
 * The API enforces these roles; the web hides what a role cannot use, from the same lists.
 */
import type { Role } from './roles';

/** Everyone with a role reads the register. */
export const REGISTER_READERS: readonly Role[] = ['admin', 'planner', 'technician', 'reliability'];

/** Planners and admins keep sites, areas, cabinets, banks and spares. */
export const REGISTER_EDITORS: readonly Role[] = ['admin', 'planner'];

/** Reliability engineers (and admins) keep bank designs: nameplates, limits, intervals. */
export const BANK_DESIGN_EDITORS: readonly Role[] = ['admin', 'reliability'];

/** Reliability engineers (and admins) set and reset bank baselines. */
export const BASELINE_EDITORS: readonly Role[] = ['admin', 'reliability'];

/** Status of a cabinet; `retired` only comes from retiring (a soft delete). */
export const CABINET_STATUSES = ['in-service', 'out-of-service', 'retired'] as const;
export type CabinetStatus = (typeof CABINET_STATUSES)[number];

/** Statuses a person may set on a cabinet in a form or an import. */
export const EDITABLE_CABINET_STATUSES = ['in-service', 'out-of-service'] as const;

export const CABINET_STATUS_LABELS: Record<CabinetStatus, string> = {
  'in-service': 'in service',
  'out-of-service': 'out of service',
  retired: 'retired',
};

/** How much the plant loses when the cabinet's drive stops, least first. */
export const CRITICALITIES = ['low', 'medium', 'high', 'critical'] as const;
export type Criticality = (typeof CRITICALITIES)[number];

/** A bank is in service until it is replaced (a new bank takes its place) or removed. */
export const BANK_STATUSES = ['in-service', 'replaced', 'removed'] as const;
export type BankStatus = (typeof BANK_STATUSES)[number];

export const BANK_STATUS_LABELS: Record<BankStatus, string> = {
  'in-service': 'in service',
  replaced: 'replaced',
  removed: 'removed',
};

/**
 * Where a bank's baseline comes from: its design's nameplate (C = p × C_unit / s, τ = R × C),
 * a trusted decay run, or values a reliability engineer entered.
 */
export const BASELINE_SOURCES = ['nameplate', 'decay-run', 'manual'] as const;
export type BaselineSource = (typeof BASELINE_SOURCES)[number];

export const BASELINE_SOURCE_LABELS: Record<BaselineSource, string> = {
  nameplate: 'from nameplate',
  'decay-run': 'from a trusted decay run',
  manual: 'entered by hand',
};

/** A spare is a whole drive or a DC-link bank kept in a store. */
export const SPARE_KINDS = ['bank', 'drive'] as const;
export type SpareKind = (typeof SPARE_KINDS)[number];

export const SPARE_STATUSES = ['in-store', 'issued'] as const;
export type SpareStatus = (typeof SPARE_STATUSES)[number];

/**
 * Default days between reformings of a stored electrolytic spare: yearly (DOMAIN.md: stored
 * over ~1-2 years must be reformed; procedures differ by maker, so it is editable per spare).
 */
export const DEFAULT_REFORMING_INTERVAL_DAYS = 365;

/** Kinds of register record the audit trail knows. */
export const REGISTER_ENTITY_TYPES = ['site', 'area', 'cabinet', 'bank', 'bank-design', 'spare', 'person', 'visit', 'shutdown-window', 'decay-run', 'photo'] as const;
export type RegisterEntityType = (typeof REGISTER_ENTITY_TYPES)[number];

/** What happened to a record. */
export const AUDIT_ACTIONS = ['create', 'update', 'retire', 'restore', 'replace', 'baseline', 'import', 'start', 'log', 'review', 'cancel', 'replan', 'miss', 'record', 'correct'] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** Largest CSV accepted by the cabinet import, in bytes (2 MiB: tens of thousands of rows). */
export const IMPORT_MAX_BYTES = 2 * 1024 * 1024;

/** Most data rows one import may hold. */
export const IMPORT_MAX_ROWS = 5000;

/** Problems an import answer lists one by one; the rest are counted (`problemsNotListed`). */
export const IMPORT_PROBLEMS_LISTED = 200;

/** Rows an import preview carries one by one (the first ones); `rowCount` counts them all. */
export const IMPORT_ROWS_LISTED = 200;
