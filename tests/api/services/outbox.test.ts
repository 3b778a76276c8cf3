/**
 * The outbox: a message is written in its write's unit of work, so a rolled-back write leaves
 * none and a committed one exactly one. Connected as the app's role, which may mark it processed.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../../api/src/db/sequelize';
import { OutboxMessage } from '../../../api/src/models/outbox-message';
import { enqueueOutboxMessage } from '../../../api/src/services/outbox';
import { createSite } from '../../../api/src/services/sites';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { countRows, createActor } from '../../support/register';

let planner: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
});

describe('enqueueOutboxMessage', () => {
  it('when the write commits, then exactly one message is left, with its topic, payload, actor and the unit of work’s instant', async () => {
    const before = await countRows('outbox_messages');
    const now = new Date('2030-02-03T04:05:06.789Z');
    const site = await withUnitOfWork(
      planner.actor,
      async (uow) => {
        const created = await createSite(uow, {
          name: 'Outbox Works',
          code: 'OBX',
          address: '',
          timeZone: 'UTC',
        });
        await enqueueOutboxMessage(uow, 'site.added', { siteId: created.id });
        return created;
      },
      { now },
    );
    expect(await countRows('outbox_messages')).toBe(before + 1);
    const message = await OutboxMessage.findOne({ where: { topic: 'site.added' } });
    expect(message).toMatchObject({
      payload: { siteId: site.id },
      actorId: planner.actor.id,
      attempts: 0,
      processedAt: null,
    });
    expect(message!.enqueuedAt.toISOString()).toBe(now.toISOString());
  });

  it('when the write rolls back, then no message is left', async () => {
    const before = await countRows('outbox_messages');
    const sitesBefore = await countRows('sites');
    await expect(
      withUnitOfWork(planner.actor, async (uow) => {
        const created = await createSite(uow, {
          name: 'Never Works',
          code: 'NVR',
          address: '',
          timeZone: 'UTC',
        });
        await enqueueOutboxMessage(uow, 'site.added', { siteId: created.id });
        throw new Error('the write fails after enqueueing');
      }),
    ).rejects.toThrow('the write fails after enqueueing');
    expect(await countRows('outbox_messages')).toBe(before);
    expect(await countRows('sites')).toBe(sitesBefore);
  });

  it('when several messages are left in one unit of work, then their ids keep the order they were written in', async () => {
    const ids = await withUnitOfWork(null, async (uow) => {
      const first = await enqueueOutboxMessage(uow, 'test.first', {});
      const second = await enqueueOutboxMessage(uow, 'test.second', {});
      return [first.id, second.id];
    });
    expect(BigInt(ids[1]!)).toBeGreaterThan(BigInt(ids[0]!));
    const [rows] = await sequelize.query(
      `SELECT topic, actor_id FROM outbox_messages WHERE id IN (:ids) ORDER BY id`,
      { replacements: { ids } },
    );
    expect(rows).toEqual([
      { topic: 'test.first', actor_id: null },
      { topic: 'test.second', actor_id: null },
    ]);
  });

  it('when the topic is not dotted kebab-case words, then it is refused and nothing is left', async () => {
    const before = await countRows('outbox_messages');
    for (const topic of [
      '',
      'alert',
      'Alert.Raised',
      'alert..raised',
      'alert.raised ',
      'alert raised.x',
    ]) {
      await expect(
        withUnitOfWork(null, (uow) => enqueueOutboxMessage(uow, topic, {})),
        topic,
      ).rejects.toThrow(/outbox topic/);
    }
    expect(await countRows('outbox_messages')).toBe(before);
  });

  it('when a job has acted on a message, then the app may mark it processed (ordinary rights, unlike the audit trail)', async () => {
    const message = await withUnitOfWork(null, (uow) =>
      enqueueOutboxMessage(uow, 'test.processed', { n: 1 }),
    );
    await message.update({ processedAt: new Date('2030-02-03T05:00:00Z'), attempts: 1 });
    const [rows] = await sequelize.query(
      `SELECT count(*)::int AS n FROM outbox_messages WHERE processed_at IS NULL AND id = :id`,
      {
        replacements: { id: message.id },
      },
    );
    expect(rows).toEqual([{ n: 0 }]);
  });
});
