/**
 * The missed-visit check: runs every 15 minutes and at every start (job-queue.ts). A visit still
 * `planned` MISSED_VISIT_AFTER_HOURS after its planned end becomes `missed`, through the visits
 * service's `miss` action, acting as Ebbline (actor null), each with its audit entry.
 *
 * Idempotent: a second run at the same instant finds nothing; a visit started, replanned or
 * cancelled meanwhile is left alone (the service refuses the action, and the run moves on).
 */
import type PgBoss from 'pg-boss';
import { missedVisitCutoff } from '../../../shared/domain/missed-visits';
import { getConfig } from '../config/env';
import { isDatabaseUnavailable } from '../db/connection-errors';
import { AppError } from '../errors';
import { logger } from '../logger';
import { listVisitsToMarkMissed } from '../services/missed-visits';
import { transitionVisit } from '../services/visits';
import { withUnitOfWork } from '../services/unit-of-work';

/** What one run did. */
export interface MissedVisitRun {
  /** The instant the run acted at (every visit's `missed_at` and audit entry). */
  ranAt: string;
  /** Planned visits ending before this became missed. */
  cutoffAt: string;
  /** Ids of the visits marked missed. */
  marked: string[];
  /** Ids left alone: their state or version changed between the look-up and the change. */
  leftAlone: string[];
}

/** Visits looked up per round; a run goes round until a round finds fewer. */
const ROUND_SIZE = 200;

/** Refusals that mean "someone changed this visit meanwhile": not an error of the run. */
const CHANGED_MEANWHILE = new Set(['visit-state', 'stale-version', 'not-found']);

/**
 * Marks every visit missed whose planned end plus `afterHours` lies before `now`.
 *
 * @param now - the instant the run acts at (a test passes a fake clock's)
 * @param afterHours - hours after the planned end; default MISSED_VISIT_AFTER_HOURS
 * @throws the first failure that is not "changed meanwhile" (the queue retries the run), after
 *   trying every other visit
 */
export async function runMissedVisitCheck(
  now: Date,
  afterHours = getConfig().MISSED_VISIT_AFTER_HOURS,
): Promise<MissedVisitRun> {
  const cutoff = missedVisitCutoff(now, afterHours);
  const marked: string[] = [];
  const leftAlone: string[] = [];
  const tried = new Set<string>();
  let failure: unknown;
  for (;;) {
    const round = (await listVisitsToMarkMissed(cutoff, ROUND_SIZE + tried.size)).filter(
      (v) => !tried.has(v.id),
    );
    for (const visit of round) {
      tried.add(visit.id);
      try {
        await withUnitOfWork(
          null,
          (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version }),
          { now },
        );
        marked.push(visit.id);
      } catch (err) {
        if (err instanceof AppError && CHANGED_MEANWHILE.has(err.code)) {
          leftAlone.push(visit.id);
        } else if (isDatabaseUnavailable(err)) {
          throw err;
        } else {
          logger.error(
            { err, visitId: visit.id },
            'missed-visit check: a visit could not be marked',
          );
          failure ??= err;
        }
      }
    }
    if (round.length < ROUND_SIZE) break;
  }
  if (failure) throw failure;
  return { ranAt: now.toISOString(), cutoffAt: cutoff.toISOString(), marked, leftAlone };
}

/** The queue's handler: one run at the instant the job is taken. */
export async function handleMissedVisitJob(jobs: PgBoss.Job[]): Promise<MissedVisitRun | null> {
  if (jobs.length === 0) return null;
  const run = await runMissedVisitCheck(new Date());
  if (run.marked.length > 0 || run.leftAlone.length > 0) {
    logger.info(
      { marked: run.marked.length, leftAlone: run.leftAlone.length, cutoffAt: run.cutoffAt },
      'missed-visit check: visits marked missed',
    );
  }
  return run;
}
