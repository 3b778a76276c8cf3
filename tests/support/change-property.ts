/**
 * "A change changes only what it names", as a property: a PATCH naming one field (any field,
 * any valid value) leaves every other field of the record as it was.
 */
import type { Express } from 'express';
import fc from 'fast-check';
import request from 'supertest';
import { expect } from 'vitest';

export interface ChangeCase {
  /** Where the record is read and changed, e.g. `/api/cabinets/<id>`. */
  path: string;
  headers: Record<string, string>;
  /** Valid values of each field a change may name. */
  fields: Record<string, fc.Arbitrary<unknown>>;
  /** Fields of the answer that follow from a field (e.g. `areaName` from `areaId`). */
  follows?: Record<string, readonly string[]>;
  /** Reads the record when `path` does not answer GET (e.g. a person from the people list). */
  read?: () => Promise<Record<string, unknown>>;
  /** Fields sent with every change besides the one named (e.g. nothing, or a confirmation). */
  withEvery?: Record<string, unknown>;
}

/** Fields every change moves: the version and the time of the change. */
const ALWAYS_MOVES = ['version', 'updatedAt'];

/**
 * Sends changes naming one field each, every field at least once, then `runs` more with
 * random fields and values; after each, every field not named (nor following from it) is as
 * before.
 */
export async function assertChangesOnlyWhatTheyName(
  app: Express,
  change: ChangeCase,
  runs = 40,
): Promise<void> {
  const read =
    change.read ??
    (async () =>
      (await request(app).get(change.path).set(change.headers)).body as Record<string, unknown>);
  const names = Object.keys(change.fields);
  const oneField = fc
    .constantFrom(...names)
    .chain((name) => change.fields[name]!.map((value) => [name, value] as const));
  const examples = names.map(
    (name) =>
      [[name, fc.sample(change.fields[name]!, { numRuns: 1, seed: 7 })[0]] as const] as [
        readonly [string, unknown],
      ],
  );
  await fc.assert(
    fc.asyncProperty(oneField, async ([name, value]) => {
      const before = await read();
      const body = {
        ...change.withEvery,
        ...('version' in before ? { version: before.version } : {}),
        [name]: value,
      };
      const res = await request(app).patch(change.path).set(change.headers).send(body);
      expect(res.status, `PATCH ${JSON.stringify(body)} → ${JSON.stringify(res.body)}`).toBe(200);
      const after = await read();
      const moved = new Set([name, ...ALWAYS_MOVES, ...(change.follows?.[name] ?? [])]);
      const unnamed = (record: Record<string, unknown>) =>
        Object.fromEntries(Object.entries(record).filter(([key]) => !moved.has(key)));
      expect(unnamed(after), `a change naming only ${name} changed another field`).toEqual(
        unnamed(before),
      );
    }),
    { numRuns: runs + names.length, examples, endOnFailure: true },
  );
}
