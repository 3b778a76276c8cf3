/**
 * The outbox: a write that needs something done later (an alert raised, a mail sent) leaves a
 * message here in its own unit of work, so the message exists exactly when the change does: a
 * rolled-back write leaves none, a committed one leaves it for the job to pick up, even when
 * the process stops right after the commit.
 *
 * What enqueues what today: a decay run recorded, corrected or reviewed (`decay-run.recorded`,
 * `decay-run.corrected`, `decay-run.reviewed`) and an unplanned visit (`visit.unplanned`), for
 * the alert and mail jobs to come; no job consumes yet. The register's writes are kept in the audit trail; the jobs that later issues add (alerts, mail) add their topics and
 * their producers together, each producer calling `enqueueOutboxMessage` from the write
 * service whose change the job acts on.
 */
import { OutboxMessage } from '../models/outbox-message';
import type { Actor, UnitOfWork } from './unit-of-work';

/** A topic names what happened, in dotted kebab-case words: "decay-run.recorded", "alert.raised". */
export const OUTBOX_TOPIC_PATTERN = /^[a-z][a-z0-9-]*(\.[a-z][a-z0-9-]*)+$/;

/**
 * Leaves a message for a later job in the unit of work's transaction, stamped with its actor
 * and instant.
 *
 * @param topic - what happened, matching `OUTBOX_TOPIC_PATTERN`
 * @param payload - what the job needs (ids rather than copies of records), plain JSON
 * @throws Error for a malformed topic: a programming mistake, not a person's
 * @example
 *   await enqueueOutboxMessage(uow, 'decay-run.recorded', { decayRunId: run.id });
 */
export async function enqueueOutboxMessage(
  uow: UnitOfWork<Actor>,
  topic: string,
  payload: Record<string, unknown>,
): Promise<OutboxMessage> {
  if (!OUTBOX_TOPIC_PATTERN.test(topic)) {
    throw new Error(
      `outbox topic "${topic}" is not dotted kebab-case words such as "decay-run.recorded"`,
    );
  }
  return OutboxMessage.create(
    { topic, payload, actorId: uow.actor?.id ?? null, enqueuedAt: uow.now },
    { transaction: uow.transaction },
  );
}
