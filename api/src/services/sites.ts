/** Use cases of sites: list, read, create, change, retire. */
import { literal, Op, type Transaction, type WhereOptions } from 'sequelize';
import type { SiteData, SiteListQuery, SiteUpdate } from '../../../shared/schemas/site';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Site } from '../models/site';
import { recordCreation, saveChange } from './audited-change';
import { SITE_TRAIL } from './audited-fields';
import { changedFields, containsPattern, duplicateValue, lockForChange, pageWindow, sameTextAs } from './register-records';
import type { UnitOfWork } from './unit-of-work';


/** Columns counting a site's areas and cabinets in use, for lists and pages. */
const SITE_COUNTS = [
  [literal(`(SELECT count(*)::int FROM areas a WHERE a.site_id = "Site"."id" AND a.retired_at IS NULL)`), 'areaCount'],
  [
    literal(
      `(SELECT count(*)::int FROM cabinets c JOIN areas a ON a.id = c.area_id WHERE a.site_id = "Site"."id" AND c.retired_at IS NULL)`,
    ),
    'cabinetCount',
  ],
] as const;

/** One page of sites matching the query, with the total. */
export async function listSites(query: SiteListQuery): Promise<{ rows: Site[]; count: number }> {
  const where: WhereOptions<Site> = {};
  if (!query.includeRetired) Object.assign(where, { retiredAt: null });
  if (query.q) {
    const pattern = containsPattern(query.q);
    Object.assign(where, { [Op.or]: [{ name: { [Op.iLike]: pattern } }, { code: { [Op.iLike]: pattern } }] });
  }
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const [rows, count] = await Promise.all([
    Site.findAll({
      where,
      attributes: { include: [...SITE_COUNTS] as never },
      order: [[query.sort.field, dir], ['id', 'ASC']],
      ...pageWindow(query),
    }),
    Site.count({ where }),
  ]);
  return { rows, count };
}

/** A site with its counts. @throws AppError `not-found` */
export async function getSite(id: string, transaction?: Transaction): Promise<Site> {
  const site = await Site.findByPk(id, { attributes: { include: [...SITE_COUNTS] as never }, transaction });
  if (!site) throw AppError.notFound('Site');
  return site;
}

async function assertSiteUnique(
  data: { name?: string; code?: string },
  exceptId: string | null,
  transaction: Transaction,
): Promise<void> {
  const others = { retiredAt: null, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) };
  if (data.code !== undefined) {
    const clash = await Site.findOne({ where: { ...others, [Op.and]: [sameTextAs('code', data.code)] }, transaction });
    if (clash) throw duplicateValue('code', `Another site already uses the code ${data.code}.`);
  }
  if (data.name !== undefined) {
    const clash = await Site.findOne({ where: { ...others, [Op.and]: [sameTextAs('name', data.name)] }, transaction });
    if (clash) throw duplicateValue('name', `Another site is already called ${data.name}.`);
  }
}

/**
 * Adds a site and its audit entry.
 * @throws AppError `duplicate` when the code or name is taken
 */
export async function createSite(uow: UnitOfWork, input: SiteData): Promise<Site> {
  const { transaction } = uow;
  await assertSiteUnique(input, null, transaction);
  const site = await Site.create(input, { transaction });
  await recordCreation(uow, SITE_TRAIL, site, `Added site ${site.name}`);
  return getSite(site.id, transaction);
}

/**
 * Changes a site's fields when `input.version` is still current.
 * @throws AppError `not-found`, `stale-version`, `retired`, `duplicate`
 */
export async function updateSite(uow: UnitOfWork, id: string, input: SiteUpdate): Promise<Site> {
  const { transaction } = uow;
  const { version, ...fields } = input;
  const site = await lockForChange(Site, id, version, 'site', transaction);
  const changes = changedFields(site, fields);
  if (Object.keys(changes).length > 0) {
    await assertSiteUnique(changes, id, transaction);
    await saveChange(uow, SITE_TRAIL, site, changes, { action: 'update', summary: (s) => `Changed site ${s.name}` });
  }
  return getSite(id, transaction);
}

/**
 * Retires a site (soft delete). A site with areas in use cannot be retired.
 * @throws AppError `not-found`, `stale-version`, `retired`, `in-use`
 */
export async function retireSite(uow: UnitOfWork, id: string, version: number): Promise<Site> {
  const { transaction } = uow;
  const site = await lockForChange(Site, id, version, 'site', transaction);
  const areasInUse = await Area.count({ where: { siteId: id, retiredAt: null }, transaction });
  if (areasInUse > 0) {
    throw new AppError('in-use', `${site.name} still has ${areasInUse} area(s) in use. Retire its areas first.`);
  }
  await saveChange(uow, SITE_TRAIL, site, { retiredAt: uow.now }, { action: 'retire', summary: (s) => `Retired site ${s.name}` });
  return getSite(id, transaction);
}
