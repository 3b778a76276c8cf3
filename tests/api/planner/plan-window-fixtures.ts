/**
 * Records the plan-a-window and technician-load tests stand on: technicians with names and
 * sites, banks with a baseline τ set by hand, shutdown windows and visits written straight to
 * their tables (each test states the times it cares about).
 */
import { QueryTypes } from 'sequelize';
import type { Role } from '../../../shared/constants/roles';
import { sequelize } from '../../../api/src/db/sequelize';
import { createBank } from '../../../api/src/services/banks';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import type { AuthUser } from '../../../api/src/types/express';
import { createCaller, type TestCaller } from '../../support/auth';

/** A person with these roles, this exact name and these sites (person_sites). */
export async function makePerson(
  roles: Role[],
  name: string,
  siteIds: string[] = [],
  availableHoursPerWeek?: number,
): Promise<TestCaller & { id: string; name: string }> {
  const caller = await createCaller(roles, name.replace(/\s+/g, '-').toLowerCase());
  await sequelize.query('UPDATE users SET name = :name WHERE id = :id', {
    replacements: { name, id: caller.user.id },
  });
  if (availableHoursPerWeek !== undefined) {
    await sequelize.query('UPDATE users SET available_hours_per_week = :hours WHERE id = :id', {
      replacements: { hours: availableHoursPerWeek, id: caller.user.id },
    });
  }
  for (const siteId of siteIds) {
    await sequelize.query('INSERT INTO person_sites (user_id, site_id) VALUES (:userId, :siteId)', {
      replacements: { userId: caller.user.id, siteId },
    });
  }
  return { ...caller, id: caller.user.id, name };
}

/**
 * A bank in service at `position`, installed on `installedOn`, its baseline τ set to
 * `tauSeconds` (as a reliability engineer enters one by hand).
 */
export async function makeBankWithTau(
  actor: AuthUser,
  cabinetId: string,
  bankDesignId: string,
  position: string,
  tauSeconds: number,
  installedOn = '2020-01-15',
): Promise<string> {
  const bank = await withUnitOfWork(actor, (uow) =>
    createBank(uow, {
      cabinetId,
      bankDesignId,
      position,
      serialNumber: '',
      installedOn,
      notes: '',
    }),
  );
  await sequelize.query(
    `UPDATE banks SET baseline_tau_seconds = :tau, baseline_source = 'manual' WHERE id = :id`,
    {
      replacements: { tau: tauSeconds, id: bank.id },
    },
  );
  return bank.id;
}

/** A shutdown window of an area: its first occurrence and its recurrence (null: once). */
export async function insertWindow(input: {
  areaId: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence?: string | null;
  retired?: boolean;
}): Promise<string> {
  const [row] = await sequelize.query<{ id: string }>(
    `INSERT INTO shutdown_windows (area_id, title, starts_at, ends_at, recurrence, retired_at)
     VALUES (:areaId, :title, :startsAt, :endsAt, :recurrence, CASE WHEN :retired THEN now() END) RETURNING id`,
    {
      replacements: {
        ...input,
        recurrence: input.recurrence ?? null,
        retired: input.retired ?? false,
      },
      type: QueryTypes.SELECT,
    },
  );
  return row!.id;
}

/** A visit in a state, with its banks and technicians. */
export async function insertVisit(input: {
  cabinetId: string;
  bankIds: string[];
  technicianIds: string[];
  startsAt: string;
  endsAt: string;
  state?: string;
}): Promise<string> {
  const [row] = await sequelize.query<{ id: string }>(
    `INSERT INTO visits (cabinet_id, planned_start_at, planned_end_at, state) VALUES (:cabinetId, :startsAt, :endsAt, :state) RETURNING id`,
    { replacements: { ...input, state: input.state ?? 'planned' }, type: QueryTypes.SELECT },
  );
  for (const bankId of input.bankIds) {
    await sequelize.query(
      'INSERT INTO visit_banks (visit_id, bank_id) VALUES (:visitId, :bankId)',
      {
        replacements: { visitId: row!.id, bankId },
      },
    );
  }
  for (const userId of input.technicianIds) {
    await sequelize.query(
      'INSERT INTO visit_technicians (visit_id, user_id) VALUES (:visitId, :userId)',
      {
        replacements: { visitId: row!.id, userId },
      },
    );
  }
  return row!.id;
}

/** Rows of the visits' tables, to show that a proposal stores nothing. */
export async function visitRowCounts(): Promise<{
  visits: number;
  banks: number;
  technicians: number;
}> {
  const [row] = await sequelize.query<{ visits: number; banks: number; technicians: number }>(
    `SELECT (SELECT count(*)::int FROM visits) AS visits, (SELECT count(*)::int FROM visit_banks) AS banks,
            (SELECT count(*)::int FROM visit_technicians) AS technicians`,
    { type: QueryTypes.SELECT },
  );
  return row!;
}
