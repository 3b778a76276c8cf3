/**
 * The unit of work of a write: who acts, the one instant the write happens at, and the
 * transaction everything it stores goes into (the record, its audit entry, its outbox messages).
 *
 * The edge that starts a write (a route, a job, the seed, an import) opens it with
 * `withUnitOfWork` and hands it to exactly one service call. Services take it as their first
 * parameter and never open a transaction, read the clock or pick an HTTP status themselves:
 * so a job and a route doing the same change store the same thing, a test can fix the time,
 * and a write either happens whole (with its audit entry and outbox messages) or not at all.
 */
import type { Transaction } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { AuthUser } from '../types/express';

/** Who a write is done by: a person (signed in, or through their API token), or null for Ebbline itself (the seed, jobs). */
export type Actor = AuthUser | null;

/** What every write service receives: who, when, and the transaction to write in. */
export interface UnitOfWork<A extends Actor = AuthUser> {
  readonly actor: A;
  /** The instant of the write, read once at the edge: every time the write stores is this one. */
  readonly now: Date;
  readonly transaction: Transaction;
}

/** Where the instant of a unit of work comes from. */
export interface UnitOfWorkOptions {
  /** The instant to use instead of the system clock (a replayed import, a test). */
  now?: Date;
}

/**
 * Opens a transaction, reads the clock once, and runs `work` with the unit of work: commits
 * when it resolves, rolls back (storing nothing) when it throws, and passes its result or
 * error on.
 *
 * @param actor - who acts; null for Ebbline itself
 * @example
 *   const site = await withUnitOfWork(req.user, (uow) => createSite(uow, input));
 */
export async function withUnitOfWork<T, A extends Actor>(
  actor: A,
  work: (uow: UnitOfWork<A>) => Promise<T>,
  options: UnitOfWorkOptions = {},
): Promise<T> {
  const now = options.now ?? new Date();
  return sequelize.transaction((transaction) => work({ actor, now, transaction }));
}
