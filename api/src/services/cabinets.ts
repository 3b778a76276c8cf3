/** Use cases of cabinets: list, read, create, change, retire, and the printable label. */
import QRCode from 'qrcode';
import { literal, Op, type Includeable, type Order, type Transaction, type WhereOptions } from 'sequelize';
import type { CabinetData, CabinetListQuery, CabinetUpdate } from '../../../shared/schemas/cabinet';
import { getConfig } from '../config/env';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Bank } from '../models/bank';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { recordAuditBatch, type AuditRecordInput } from './audit';
import { applyChange, recordCreation, saveChange } from './audited-change';
import { BANK_TRAIL, CABINET_TRAIL } from './audited-fields';
import { checkCabinetChange, checkNewCabinet } from './register-checks';
import { changedFields, containsPattern, duplicateValue, fieldProblem, lockForChange, pageWindow, sameTextAs } from './register-records';
import type { UnitOfWork } from './unit-of-work';


const BANK_COUNT = [
  literal(`(SELECT count(*)::int FROM banks b WHERE b.cabinet_id = "Cabinet"."id" AND b.status = 'in-service')`),
  'bankCount',
] as const;

const CRITICALITY_RANK = literal(
  `CASE "Cabinet"."criticality" WHEN 'low' THEN 1 WHEN 'medium' THEN 2 WHEN 'high' THEN 3 ELSE 4 END`,
);

function areaWithSite(where?: WhereOptions<Area>): Includeable {
  return { model: Area, as: 'area', required: true, where, include: [{ model: Site, as: 'site', required: true }] };
}

function cabinetOrder(query: CabinetListQuery): Order {
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const byTag: Order = [
    ['tag', 'ASC'],
    ['id', 'ASC'],
  ];
  switch (query.sort.field) {
    case 'tag':
      return [
        ['tag', dir],
        ['id', dir],
      ];
    case 'site':
      return [[{ model: Area, as: 'area' }, { model: Site, as: 'site' }, 'name', dir], ...byTag];
    case 'area':
      return [[{ model: Area, as: 'area' }, 'name', dir], ...byTag];
    case 'criticality':
      return [[CRITICALITY_RANK, dir], ...byTag];
    case 'commissionedOn':
      return [['commissionedOn', `${dir} NULLS LAST`], ...byTag];
    default:
      return [[query.sort.field, dir], ...byTag];
  }
}

/**
 * One page of cabinets matching the query, with the total. Built to stay fast on a large fleet:
 * the page's ids come first from `cabinets` alone (joined to areas and sites only when the
 * filter or the order needs them), using `cabinets_tag_order` for the tag order and the trigram
 * index for the tag search (`q`, any part of the tag); then only those rows are read in full
 * and their banks counted, so a deep page never computes anything for the rows it skips.
 */
export async function listCabinets(query: CabinetListQuery): Promise<{ rows: Cabinet[]; count: number }> {
  const where: WhereOptions<Cabinet> = {};
  if (!query.includeRetired && query.status !== 'retired') Object.assign(where, { retiredAt: null });
  if (query.status) Object.assign(where, { status: query.status });
  if (query.criticality) Object.assign(where, { criticality: query.criticality });
  if (query.areaId) Object.assign(where, { areaId: query.areaId });
  if (query.q) Object.assign(where, { tag: { [Op.iLike]: containsPattern(query.q) } });
  const areaWhere = query.siteId ? { siteId: query.siteId } : undefined;
  const needsJoin = areaWhere !== undefined || query.sort.field === 'site' || query.sort.field === 'area';
  const pageJoin: Includeable[] = needsJoin
    ? [{ model: Area, as: 'area', required: true, where: areaWhere, attributes: [], include: [{ model: Site, as: 'site', required: true, attributes: [] }] }]
    : [];
  const [page, count] = await Promise.all([
    Cabinet.findAll({ attributes: ['id'], where, include: pageJoin, order: cabinetOrder(query), ...pageWindow(query), raw: true }),
    // the count needs the area only when filtering by site
    Cabinet.count({
      where,
      include: areaWhere ? [{ model: Area, as: 'area', required: true, where: areaWhere, attributes: [] }] : [],
    }),
  ]);
  const ids = page.map((c) => c.id);
  if (ids.length === 0) return { rows: [], count };
  const [rows, bankCounts] = await Promise.all([
    Cabinet.findAll({ where: { id: ids }, include: [areaWithSite()] }),
    Bank.count({ where: { cabinetId: ids, status: 'in-service' }, group: ['cabinetId'] }),
  ]);
  const banksOf = new Map(bankCounts.map((c) => [String(c.cabinetId), Number(c.count)]));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const ordered = ids.map((id) => byId.get(id)!).filter(Boolean);
  for (const cabinet of ordered) cabinet.setDataValue('bankCount' as never, (banksOf.get(cabinet.id) ?? 0) as never);
  return { rows: ordered, count };
}

/** A cabinet with its area, site and bank count. @throws AppError `not-found` */
export async function getCabinet(id: string, transaction?: Transaction): Promise<Cabinet> {
  const cabinet = await Cabinet.findByPk(id, {
    include: [areaWithSite()],
    attributes: { include: [BANK_COUNT] as never },
    transaction,
  });
  if (!cabinet) throw AppError.notFound('Cabinet');
  return cabinet;
}

/** The area a cabinet goes into: it must exist and be in use. */
async function areaInUse(areaId: string, transaction: Transaction): Promise<Area> {
  // FOR SHARE: waits for a retirement of the area under way, and holds one off meanwhile
  const area = await Area.findByPk(areaId, { include: [{ model: Site, as: 'site' }], transaction, lock: { level: transaction.LOCK.SHARE, of: Area } });
  if (!area || area.retiredAt || area.site?.retiredAt) throw fieldProblem('areaId', 'This area does not exist or is retired.');
  return area;
}

/** True when a cabinet in use (other than `exceptId`) carries `tag`, ignoring case. */
export async function tagInUse(tag: string, exceptId: string | null, transaction?: Transaction): Promise<boolean> {
  const clash = await Cabinet.findOne({
    attributes: ['id'],
    where: { retiredAt: null, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}), [Op.and]: [sameTextAs('tag', tag)] },
    transaction,
  });
  return clash !== null;
}

/**
 * Adds a cabinet to an area.
 * @throws AppError `validation-failed` naming `areaId`; `duplicate` naming `tag`
 */
export async function createCabinet(uow: UnitOfWork, input: CabinetData): Promise<Cabinet> {
  const { transaction } = uow;
  const area = await areaInUse(input.areaId, transaction);
  if (await tagInUse(input.tag, null, transaction)) {
    throw duplicateValue('tag', `${input.tag} is already in the register.`);
  }
  checkNewCabinet(uow, input);
  const cabinet = await Cabinet.create(input, { transaction });
  await recordCreation(uow, CABINET_TRAIL, cabinet, `Added cabinet ${cabinet.tag} to ${area.name}`);
  return getCabinet(cabinet.id, transaction);
}

/**
 * Changes a cabinet (moving it to another area too).
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `retired`, `duplicate`
 */
export async function updateCabinet(uow: UnitOfWork, id: string, input: CabinetUpdate): Promise<Cabinet> {
  const { transaction } = uow;
  const { version, confirmed, ...fields } = input;
  const cabinet = await lockForChange(Cabinet, id, version, 'cabinet', transaction);
  const changes = changedFields(cabinet, fields);
  if (Object.keys(changes).length > 0) {
    if (changes.areaId !== undefined) await areaInUse(changes.areaId, transaction);
    if (changes.tag !== undefined && (await tagInUse(changes.tag, id, transaction))) {
      throw duplicateValue('tag', `${changes.tag} is already in the register.`);
    }
    await checkCabinetChange(uow, id, cabinet, changes, confirmed);
    await saveChange(uow, CABINET_TRAIL, cabinet, changes, { action: 'update', summary: (c) => `Changed cabinet ${c.tag}` });
  }
  return getCabinet(id, transaction);
}

/**
 * Retires a cabinet (soft delete): its banks in service are removed with it, each with its own
 * audit entry, in the same unit of work. Their history stays.
 * @throws AppError `not-found`, `stale-version`, `retired`
 */
export async function retireCabinet(uow: UnitOfWork, id: string, version: number): Promise<Cabinet> {
  const { transaction } = uow;
  const cabinet = await lockForChange(Cabinet, id, version, 'cabinet', transaction);
  const banks = await Bank.findAll({ where: { cabinetId: id, status: 'in-service' }, transaction, lock: transaction.LOCK.UPDATE });
  const bankEntries: AuditRecordInput[] = [];
  for (const bank of banks) {
    bankEntries.push(
      await applyChange(uow, BANK_TRAIL, bank, { status: 'removed', retiredAt: uow.now }, {
        action: 'retire',
        summary: (b) => `Removed bank ${b.position} with cabinet ${cabinet.tag}`,
      }),
    );
  }
  await saveChange(uow, CABINET_TRAIL, cabinet, { status: 'retired', retiredAt: uow.now }, {
    action: 'retire',
    summary: (c) => (banks.length ? `Retired cabinet ${c.tag} and removed its ${banks.length} bank(s)` : `Retired cabinet ${c.tag}`),
  });
  await recordAuditBatch(uow, bankEntries);
  return getCabinet(id, transaction);
}

/** The address of a cabinet's page in Ebbline, from APP_URL (what its label's QR code opens). */
export function cabinetPageUrl(cabinetId: string): string {
  return new URL(`/register/cabinets/${cabinetId}`, `${getConfig().APP_URL}/`).href;
}

/** A cabinet's label: its page address and that address as a QR code (SVG). @throws AppError `not-found` */
export async function getCabinetLabel(id: string): Promise<{ cabinet: Cabinet; url: string; qrSvg: string }> {
  const cabinet = await getCabinet(id);
  const url = cabinetPageUrl(id);
  // quartile error correction survives a scuffed label on a cabinet door
  const qrSvg = await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'Q', margin: 1 });
  return { cabinet, url, qrSvg };
}
