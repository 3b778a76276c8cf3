/** Use cases of areas: list, read, create, change, retire. */
import { literal, Op, type Order, type Transaction, type WhereOptions } from 'sequelize';
import type { AreaData, AreaListQuery, AreaUpdate } from '../../../shared/schemas/area';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { recordCreation, saveChange } from './audited-change';
import { AREA_TRAIL } from './audited-fields';
import { changedFields, containsPattern, duplicateValue, fieldProblem, lockForChange, pageWindow, sameTextAs } from './register-records';
import type { UnitOfWork } from './unit-of-work';


const CABINET_COUNT = [
  literal(`(SELECT count(*)::int FROM cabinets c WHERE c.area_id = "Area"."id" AND c.retired_at IS NULL)`),
  'cabinetCount',
] as const;

const withSite = { model: Site, as: 'site', required: true } as const;

/** One page of areas matching the query, with the total. */
export async function listAreas(query: AreaListQuery): Promise<{ rows: Area[]; count: number }> {
  const where: WhereOptions<Area> = {};
  if (!query.includeRetired) Object.assign(where, { retiredAt: null });
  if (query.siteId) Object.assign(where, { siteId: query.siteId });
  if (query.q) Object.assign(where, { name: { [Op.iLike]: containsPattern(query.q) } });
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const order: Order =
    query.sort.field === 'site'
      ? [[{ model: Site, as: 'site' }, 'name', dir], ['name', 'ASC'], ['id', 'ASC']]
      : [[query.sort.field, dir], ['id', 'ASC']];
  const [rows, count] = await Promise.all([
    Area.findAll({
      where,
      include: [withSite],
      attributes: { include: [CABINET_COUNT] as never },
      order,
      ...pageWindow(query),
    }),
    Area.count({ where }),
  ]);
  return { rows, count };
}

/** An area with its site and count. @throws AppError `not-found` */
export async function getArea(id: string, transaction?: Transaction): Promise<Area> {
  const area = await Area.findByPk(id, { include: [withSite], attributes: { include: [CABINET_COUNT] as never }, transaction });
  if (!area) throw AppError.notFound('Area');
  return area;
}

async function assertAreaNameFree(siteId: string, name: string, exceptId: string | null, transaction: Transaction) {
  const clash = await Area.findOne({
    where: {
      siteId,
      retiredAt: null,
      ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}),
      [Op.and]: [sameTextAs('name', name)],
    },
    transaction,
  });
  if (clash) throw duplicateValue('name', `This site already has an area called ${name}.`);
}

/**
 * Adds an area to a site in use.
 * @throws AppError `validation-failed` naming `siteId` when the site is unknown or retired; `duplicate`
 */
export async function createArea(uow: UnitOfWork, input: AreaData): Promise<Area> {
  const { transaction } = uow;
  // FOR SHARE: waits for a retirement of the site under way, and holds one off meanwhile
  const site = await Site.findByPk(input.siteId, { transaction, lock: transaction.LOCK.SHARE });
  if (!site || site.retiredAt) throw fieldProblem('siteId', 'This site does not exist or is retired.');
  await assertAreaNameFree(input.siteId, input.name, null, transaction);
  const area = await Area.create(input, { transaction });
  await recordCreation(uow, AREA_TRAIL, area, `Added area ${area.name} to ${site.name}`);
  return getArea(area.id, transaction);
}

/** Changes an area. @throws AppError `not-found`, `stale-version`, `retired`, `duplicate` */
export async function updateArea(uow: UnitOfWork, id: string, input: AreaUpdate): Promise<Area> {
  const { transaction } = uow;
  const { version, ...fields } = input;
  const area = await lockForChange(Area, id, version, 'area', transaction);
  const changes = changedFields(area, fields);
  if (Object.keys(changes).length > 0) {
    if (changes.name !== undefined) await assertAreaNameFree(area.siteId, changes.name, id, transaction);
    await saveChange(uow, AREA_TRAIL, area, changes, { action: 'update', summary: (a) => `Changed area ${a.name}` });
  }
  return getArea(id, transaction);
}

/** Retires an area with no cabinets in use. @throws AppError `not-found`, `stale-version`, `retired`, `in-use` */
export async function retireArea(uow: UnitOfWork, id: string, version: number): Promise<Area> {
  const { transaction } = uow;
  const area = await lockForChange(Area, id, version, 'area', transaction);
  const inUse = await Cabinet.count({ where: { areaId: id, retiredAt: null }, transaction });
  if (inUse > 0) {
    throw new AppError('in-use', `${area.name} still has ${inUse} cabinet(s) in use. Retire or move them first.`);
  }
  await saveChange(uow, AREA_TRAIL, area, { retiredAt: uow.now }, { action: 'retire', summary: (a) => `Retired area ${a.name}` });
  return getArea(id, transaction);
}
