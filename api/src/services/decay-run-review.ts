/**
 * The review of decay runs by reliability engineers (and admins): a run's current version is
 * accepted or queried with a comment that goes back to the technician; an accepted run with a
 * trustworthy τ can become its bank's baseline; a logged visit whose current runs are all
 * reviewed becomes reviewed. Everything a review changes, with its audit entries and its
 * outbox message, is one unit of work.
 */
import { QueryTypes } from 'sequelize';
import { VISIT_REVIEWERS } from '../../../shared/constants/planning';
import { hasAnyRole } from '../../../shared/constants/roles';
import { REVIEW_STATE_LABELS, type ReviewState } from '../../../shared/constants/decay-runs';
import type { DecayRunReview, ReviewQueueQuery } from '../../../shared/schemas/decay-run';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Bank } from '../models/bank';
import { Cabinet } from '../models/cabinet';
import { DecayRun } from '../models/decay-run';
import { Visit } from '../models/visit';
import { recordAudit } from './audit';
import { setBankBaseline } from './banks';
import { loadDecayRun } from './decay-runs';
import { enqueueOutboxMessage } from './outbox';
import type { UnitOfWork } from './unit-of-work';
import { getVisit, transitionVisit } from './visits';

/** What a review did beside the run itself, for the caller and the outbox. */
export interface DecayRunReviewResult {
  /** The run as reviewed, loaded for its answer (bank, cabinet, people, versions). */
  run: DecayRun;
  /** True when the run became its bank's baseline. */
  baselineSet: boolean;
  /** True when the review moved the visit to reviewed. */
  visitReviewed: boolean;
}

/**
 * Reviews the current version of a decay run: accepted, or queried with a comment for the
 * technician. With `useAsBaseline` (accepted only), the run's τ and its capacitance (at 20 °C
 * when known, else the capacitance compared with the baseline) become the bank's baseline
 * (source `decay-run`, the run named, set by the reviewer at the unit of work's instant), with
 * the bank's audit entry. When the run's visit is logged and this was its last current run
 * waiting for review, the visit becomes reviewed (its own audit entry). A run may be reviewed
 * again (a queried run accepted after the technician's answer); a visit still under way is left
 * as it is. Writes the run's audit entry and the outbox message `decay-run.reviewed`.
 *
 * @param runId - the run's id; it must be the current version (not corrected since)
 * @throws AppError `forbidden` (not a reliability engineer or admin), `not-found`,
 *   `validation-failed` naming `comment` (queried without one) or `useAsBaseline` (not accepted),
 *   `superseded` (a newer version exists: review that one), `baseline-refused` (the run gave no
 *   trustworthy τ, or something was seen wrong at the cabinet), and those of setting the
 *   baseline (`replaced`, for a bank no longer in service)
 */
export async function reviewDecayRun(uow: UnitOfWork, runId: string, input: DecayRunReview): Promise<DecayRunReviewResult> {
  const { transaction, actor } = uow;
  if (!hasAnyRole(actor.roles, VISIT_REVIEWERS)) {
    throw AppError.forbidden('Only reliability engineers and admins review decay runs.');
  }
  const comment = input.comment.trim();
  if (input.outcome === 'queried' && comment === '') {
    throw AppError.badRequest('comment: Say in the comment what is wrong or missing, so the technician can put it right.', [
      { path: 'comment', message: 'Say in the comment what is wrong or missing, so the technician can put it right.' },
    ]);
  }
  if (input.useAsBaseline && input.outcome !== 'accepted') {
    throw AppError.badRequest('useAsBaseline: Only an accepted run can be used as the baseline.', [
      { path: 'useAsBaseline', message: 'Only an accepted run can be used as the baseline.' },
    ]);
  }

  // the run's row is locked: a correction or another review of it waits for this one
  const run = await DecayRun.findByPk(runId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!run) throw AppError.notFound('Decay run');
  const successor = await DecayRun.findOne({ where: { supersedesId: run.id }, attributes: ['id', 'version'], transaction });
  if (successor) {
    throw new AppError(
      'superseded',
      `This is version ${run.version} of the run; it was corrected since. Review version ${successor.version} instead.`,
    );
  }
  const bank = await Bank.findByPk(run.bankId, { transaction });
  if (!bank) throw AppError.notFound('Bank');
  const cabinet = await Cabinet.findByPk(bank.cabinetId, { attributes: ['tag'], transaction });
  const where = `bank ${bank.position} of ${cabinet?.tag ?? 'a cabinet'}`;

  // refused before anything is written: the run gives no trustworthy reference
  const verdict = run.verdict;
  if (input.useAsBaseline) {
    if (verdict.status !== 'ok') {
      throw new AppError('baseline-refused', `This run cannot be the baseline of ${where}: it gave no trustworthy τ. ${verdict.reason}`);
    }
    if (verdict.visualFindings.length > 0) {
      throw new AppError(
        'baseline-refused',
        `Something was seen wrong at the cabinet on this run, so it cannot be the baseline of ${where}.`,
      );
    }
  }

  if (input.outcome === 'queried' && bank.baselineDecayRunId === run.id) {
    throw AppError.conflict(
      `This run is the baseline of ${where}. Set the bank's baseline again on its page before querying the run.`,
    );
  }

  const before = reviewSnapshot(run);
  run.set({ reviewState: input.outcome, reviewComment: comment, reviewedById: actor.id, reviewedAt: uow.now });
  await run.save({ transaction });
  await recordAudit(uow, {
    entityType: 'decay-run',
    entityId: run.id,
    action: 'review',
    summary: `${input.outcome === 'accepted' ? 'Accepted' : 'Queried'} the decay run on ${where}${comment ? `: ${comment}` : ''}`,
    before,
    after: reviewSnapshot(run),
  });

  let baselineSet = false;
  if (input.useAsBaseline && verdict.status === 'ok') {
    const capacitanceMicrofarads = verdict.capacitance.at20CMicrofarads ?? verdict.capacitance.comparedMicrofarads;
    await setBankBaseline(uow, bank.id, {
      version: bank.version,
      source: 'decay-run',
      tauSeconds: verdict.tauSeconds,
      capacitanceMicrofarads,
      decayRunId: run.id,
      note: `From the decay run of ${run.isolatedAt.toISOString().slice(0, 10)}, accepted on review${
        verdict.capacitance.at20CMicrofarads === null ? ' (capacitance not normalised to 20 °C)' : ''
      }`,
    });
    baselineSet = true;
  }

  const visitReviewed = await reviewVisitWhenDone(uow, run.visitId);
  await enqueueOutboxMessage(uow, 'decay-run.reviewed', {
    runId: run.id,
    bankId: run.bankId,
    visitId: run.visitId,
    outcome: input.outcome,
    baselineSet,
    visitReviewed,
  });
  return { run: await loadDecayRun(run.id, transaction), baselineSet, visitReviewed };
}

/** What the audit trail keeps of a run's review. */
function reviewSnapshot(run: DecayRun): Record<string, unknown> {
  return {
    reviewState: run.reviewState,
    reviewLabel: REVIEW_STATE_LABELS[run.reviewState as ReviewState],
    reviewComment: run.reviewComment,
    reviewedById: run.reviewedById ?? null,
    reviewedAt: run.reviewedAt ? run.reviewedAt.toISOString() : null,
    version: run.version,
  };
}

/**
 * Moves a logged visit to reviewed when none of its current runs (versions not corrected
 * since) waits for review, through the visits service (its rules, its audit entry). A visit in
 * any other state, or with a run still waiting, is left alone.
 *
 * @returns true when the visit became reviewed
 */
async function reviewVisitWhenDone(uow: UnitOfWork, visitId: string): Promise<boolean> {
  const { transaction } = uow;
  const visit = await Visit.findByPk(visitId, { attributes: ['id', 'state', 'version'], transaction, lock: transaction.LOCK.UPDATE });
  if (!visit || visit.state !== 'logged') return false;
  const [waiting] = await sequelize.query<{ count: number }>(
    `SELECT count(*)::int AS count FROM decay_runs r
      WHERE r.visit_id = :visitId AND r.review_state = 'pending'
        AND NOT EXISTS (SELECT 1 FROM decay_runs later WHERE later.supersedes_id = r.id)`,
    { replacements: { visitId }, type: QueryTypes.SELECT, transaction },
  );
  if ((waiting?.count ?? 0) > 0) return false;
  await transitionVisit(uow, visitId, { action: 'review', version: visit.version });
  return true;
}

// a current run (not corrected since) of the visit still waiting for review
const RUN_WAITING = `EXISTS (
  SELECT 1 FROM decay_runs r
   WHERE r.visit_id = v.id AND r.review_state = 'pending'
     AND NOT EXISTS (SELECT 1 FROM decay_runs later WHERE later.supersedes_id = r.id)
)`;

/**
 * The review queue: every logged visit, and every reviewed visit holding a current run still
 * waiting for review (a queried run the technician corrected since), the one waiting longest
 * first (by when it was logged). Only reliability engineers and admins read it (the route says so).
 *
 * @returns one page of the visits, loaded as the visits' answers show them, and their count
 */
export async function listReviewQueue(query: ReviewQueueQuery): Promise<{ rows: Visit[]; count: number }> {
  const where = `WHERE v.state = 'logged' OR (v.state = 'reviewed' AND ${RUN_WAITING})`;
  const [ids, counts] = await Promise.all([
    sequelize.query<{ id: string }>(
      `SELECT v.id FROM visits v ${where}
        ORDER BY coalesce(v.logged_at, v.planned_start_at) ASC, v.id ASC LIMIT :limit OFFSET :offset`,
      { replacements: { limit: query.pageSize, offset: (query.page - 1) * query.pageSize }, type: QueryTypes.SELECT },
    ),
    sequelize.query<{ count: number }>(`SELECT count(*)::int AS count FROM visits v ${where}`, { type: QueryTypes.SELECT }),
  ]);
  const rows: Visit[] = [];
  // one after another: a page is at most a couple of hundred visits, each one query
  for (const { id } of ids) rows.push(await getVisit(id, null));
  return { rows, count: counts[0]?.count ?? 0 };
}
