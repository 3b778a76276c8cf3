/**
 * Request bodies as a careless client or an attacker sends them, for the write routes'
 * "never a 5xx, nothing stored on a 4xx" corpus: near a valid body (fields kept, dropped,
 * or replaced by a hostile value, unknown fields added) and far from it (random objects,
 * arrays, bare values, broken JSON). Values that JSON cannot carry (NaN, ±Infinity, numbers
 * beyond a double) are written into the text as raw tokens.
 */
import fc from 'fast-check';
import request from 'supertest';
import type { Express } from 'express';
import { expect } from 'vitest';

/** A raw JSON token written into the body text in place of the string that names it. */
const RAW_TOKENS = [
  'NaN',
  'Infinity',
  '-Infinity',
  '1e999',
  '-1e999',
  '1e-400',
  '123456789012345678901234567890123',
  '0x1F',
  '01',
] as const;
const rawMarker = (token: string) => `@@raw:${token}@@`;

/** Any UTF-16 code unit, lone surrogates and NUL included. */
const anyCodeUnit = fc.integer({ min: 0, max: 0xffff }).map((c) => String.fromCharCode(c));

/** Single values that have broken servers before. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(
    null,
    true,
    false,
    0,
    -0,
    -1,
    0.5,
    1e308,
    -1e308,
    2 ** 53 + 1,
    Number.MIN_VALUE,
    -Number.MIN_VALUE,
    2 ** 31,
    -(2 ** 31) - 1,
    '',
    ' ',
    '   \t\n',
    'NaN',
    'Infinity',
    'null',
    'true',
    '12',
    '\u0000',
    'a\u0000b',
    '\uD800',
    'x\uDFFFy',
    '\uDBFF\uDBFF',
    '\u202Eevil',
    '\u0001\u001F\u007F\u0085',
    'é'.normalize('NFD'),
    '🚰'.repeat(50),
    'x'.repeat(100_000),
    '0000-01-01',
    '1899-12-31',
    '2201-01-01',
    '9999-12-31',
    '2024-02-30',
    '2024-13-01',
    '2024-1-1',
    '+002024-01-01',
    '2024-01-01T00:00:00Z',
    '00000000-0000-0000-0000-000000000000',
    'ffffffff-ffff-4fff-bfff-ffffffffffff',
    "'; DROP TABLE cabinets; --",
    '%_\\',
    '<script>alert(1)</script>',
    '__proto__',
    [],
    [null],
    [1, 'two', {}],
    {},
    { $gt: '' },
    { nested: { deep: [1, { x: '\u0000' }] } },
    ...RAW_TOKENS.map(rawMarker),
  ),
  fc.string({ unit: anyCodeUnit, maxLength: 30 }),
  fc.string({ maxLength: 300 }),
  fc.double(),
  fc.integer(),
  fc
    .integer({ min: -3_000_000, max: 3_000_000 })
    .map((days) => new Date(days * 86_400_000).toISOString().slice(0, 10)),
  fc.uuid(),
);

/** Field names a body should not have. */
const unknownKey = fc.oneof(
  fc.constantFrom(
    'id',
    'version',
    'createdAt',
    'retiredAt',
    'confirmed',
    'status',
    '__proto__',
    'constructor',
    'baselineTauSeconds',
    'roles',
    '',
  ),
  fc.string({ maxLength: 12 }),
);

/** A body near `valid`: each field kept, left out, or replaced, and unknown fields added. */
export function bodyNear(valid: Record<string, unknown>): fc.Arbitrary<unknown> {
  const fields = Object.fromEntries(
    Object.entries(valid).map(([key, value]) => [
      key,
      fc.oneof(
        { weight: 5, arbitrary: fc.constant({ keep: value }) },
        { weight: 1, arbitrary: fc.constant(null) },
        { weight: 2, arbitrary: hostileValue.map((v) => ({ keep: v })) },
      ),
    ]),
  );
  return fc
    .tuple(fc.record(fields), fc.dictionary(unknownKey, hostileValue, { maxKeys: 3 }))
    .map(([chosen, extra]) => {
      const body: Record<string, unknown> = { ...extra };
      for (const [key, choice] of Object.entries(chosen)) {
        if (choice !== null) body[key] = (choice as { keep: unknown }).keep;
      }
      return body;
    });
}

/** The text of a request body: near `valid` mostly, sometimes anything, sometimes not JSON at all. */
export function hostileBody(valid: Record<string, unknown>): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 12, arbitrary: bodyNear(valid).map(toJsonText) },
    {
      weight: 2,
      arbitrary: fc.dictionary(unknownKey, hostileValue, { maxKeys: 6 }).map(toJsonText),
    },
    { weight: 2, arbitrary: hostileValue.map(toJsonText) },
    {
      weight: 1,
      arbitrary: fc.oneof(
        fc.constantFrom(
          '',
          '{',
          '{"a":',
          '[1,',
          'null',
          '"text"',
          '{"a":1}}',
          '\u0000',
          '{"a":"\\ud800"}',
          '{"a":"\\u0000"}',
          '\uFEFF{}',
        ),
        fc.string({ unit: anyCodeUnit, maxLength: 60 }),
      ),
    },
  );
}

/** JSON text with the raw-token markers replaced by the bare tokens. */
export function toJsonText(value: unknown): string {
  const text = JSON.stringify(value) ?? 'null';
  return text.replace(/"@@raw:([^@"]+)@@"/g, '$1');
}

/** The rows and versions of every table a write may touch, in one round trip. */
export async function storedState(): Promise<Record<string, string>> {
  const { sequelize } = await import('../../api/src/db/sequelize');
  const versioned = ['sites', 'areas', 'cabinets', 'banks', 'bank_designs', 'spares', 'visits'];
  const counted = ['bank_design_versions', 'audit_entries', 'users', 'api_tokens', 'access_events', 'visit_banks', 'visit_technicians', 'decay_runs', 'photos', 'outbox_messages'];
  const columns = [
    ...versioned.map(
      (t) =>
        `(SELECT count(*) || ':' || coalesce(sum(version), 0) || ':' || coalesce(max(updated_at)::text, '') FROM ${t}) AS ${t}`,
    ),
    ...counted.map((t) => `(SELECT count(*)::text FROM ${t}) AS ${t}`),
    `(SELECT coalesce(string_agg(id || array_to_string(roles, ',') || active::text || available_hours_per_week::text, ';' ORDER BY id), '') FROM users) AS people`,
    `(SELECT coalesce(string_agg(user_id || ':' || site_id, ';' ORDER BY user_id, site_id), '') FROM person_sites) AS person_sites`,
  ];
  const [rows] = await sequelize.query(`SELECT ${columns.join(', ')}`);
  return (rows as Array<Record<string, string>>)[0]!;
}

/** Stands for the record's current version in a body or a query; replaced just before sending. */
export const CURRENT_VERSION = rawMarker('__VERSION__');

/** The record a write goes to: its version (for `CURRENT_VERSION`) and what the path needs. */
export interface CorpusTarget {
  version: number;
  id?: string;
}

/** One write of the corpus: method, path and caller; the body comes from the corpus. */
export interface WriteRoute {
  method: 'post' | 'patch' | 'put' | 'delete';
  /** The path; a function gets a hostile query value (or the current version) and the target. */
  path: string | ((queryValue: string, target: CorpusTarget) => string);
  /** Who calls: `{ Authorization: caller.auth }`, or a session's cookie and CSRF token. */
  headers: Record<string, string>;
  /** Reads the record the route writes to; read again after every write that went through. */
  target?: () => Promise<CorpusTarget>;
}

/** Answers seen in a corpus run, by status, for the report of the test. */
export type StatusTally = Record<number, number>;

const queryValue = fc.oneof(
  fc.constant('__VERSION__'),
  hostileValue.map((v) => (typeof v === 'string' ? v.slice(0, 200) : (JSON.stringify(v) ?? ''))),
);

/**
 * Sends `runs` hostile bodies to a route and checks each answer: never a 5xx, and on any 4xx
 * nothing stored (rows, versions and audit entries as before).
 *
 * @param valid - a valid body the corpus varies (`CURRENT_VERSION` where the version goes)
 */
export async function assertCorpusHolds(
  app: Express,
  route: WriteRoute,
  valid: Record<string, unknown>,
  runs = 1000,
): Promise<StatusTally> {
  const tally: StatusTally = {};
  // read again only after a write went through: a refusal must leave both as they were
  let stored = await storedState();
  let target: CorpusTarget = route.target ? await route.target() : { version: 1 };
  await fc.assert(
    fc.asyncProperty(hostileBody(valid), queryValue, async (bodyText, query) => {
      const version = String(target.version);
      const text = bodyText.replaceAll('__VERSION__', version);
      const path =
        typeof route.path === 'function'
          ? route.path(queryText(query.replaceAll('__VERSION__', version)), target)
          : route.path;
      const send = request(app)[route.method];
      const res = await send(path).set(route.headers).set('Content-Type', 'application/json').send(text);
      tally[res.status] = (tally[res.status] ?? 0) + 1;
      const what = `${route.method.toUpperCase()} ${path} ${text.slice(0, 300)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
      expect(res.status, what).toBeLessThan(500);
      if (res.status >= 400) {
        expect(res.body.error?.code, `a refusal says why in the standard shape: ${what}`).toEqual(
          expect.any(String),
        );
        expect(await storedState(), `refused yet stored something: ${what}`).toEqual(stored);
      } else {
        stored = await storedState();
        if (route.target) target = await route.target();
      }
    }),
    { numRuns: runs, endOnFailure: true },
  );
  return tally;
}

/** A query value as a client would encode it; a lone surrogate cannot be, so it goes as raw %-bytes. */
function queryText(value: string): string {
  try {
    return encodeURIComponent(value);
  } catch {
    return Buffer.from(value, 'utf16le').toString('hex').replace(/../g, '%$&');
  }
}
