/**
 * The lint rules that keep the layers apart (eslint.config.js): web features never import each
 * other, components/ and lib/ import no feature, and write services never read the clock.
 * Each rule is shown to refuse a probe and to let the allowed form pass.
 */
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const eslint = new ESLint();

/** The messages ESLint gives `code` as if it were the file at `filePath` (the file need not exist). */
async function lintAs(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result!.messages.map((m) => `${m.ruleId}: ${m.message}`);
}

describe('web feature boundaries', () => {
  it(
    'when a feature imports another feature, then lint refuses it naming the feature',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'web/src/features/health/probe.ts',
        `import { useMe } from '../auth/api/get-me';\nexport const probe = useMe;\n`,
      );
      expect(messages).toEqual([
        expect.stringMatching(
          /no-restricted-paths: .*web\/src\/features\/health must not import another feature/,
        ),
      ]);
    },
  );

  it(
    'when a feature imports its own files, components/ and lib/, then lint lets it',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'web/src/features/health/probe.ts',
        `import { healthQueryOptions } from './api/get-health';\nimport { Button } from '../../components/ui/button';\nimport { apiFetch } from '../../lib/api-client';\nexport const probe = [healthQueryOptions, Button, apiFetch];\n`,
      );
      expect(messages.filter((m) => m.startsWith('import-x/no-restricted-paths'))).toEqual([]);
    },
  );

  it(
    'when components/ or lib/ import a feature, then lint refuses it',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'web/src/lib/probe.ts',
        `import { useMe } from '../features/auth/api/get-me';\nexport const probe = useMe;\n`,
      );
      expect(messages).toEqual([expect.stringMatching(/no-restricted-paths: .*import no feature/)]);
    },
  );
});

describe('write services', () => {
  it(
    'when a service reads the clock, then lint refuses each way of reading it',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'api/src/services/probe.ts',
        `export const probe = () => [new Date(), Date.now()];\n`,
      );
      expect(messages).toEqual([
        expect.stringMatching(/never read the clock/),
        expect.stringMatching(/never read the clock/),
      ]);
    },
  );

  it(
    'when a service builds a date from a given instant, then lint lets it',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'api/src/services/probe.ts',
        `export const probe = (now: Date) => new Date(now.getTime() + 1000);\n`,
      );
      expect(messages).toEqual([]);
    },
  );

  it(
    'when the edge helper reads the clock, then lint lets it (it is the one place that does)',
    { timeout: 60_000 },
    async () => {
      const messages = await lintAs(
        'api/src/services/unit-of-work.ts',
        `export const probe = () => new Date();\n`,
      );
      expect(messages).toEqual([]);
    },
  );
});
