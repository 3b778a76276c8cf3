import { describe, expect, it } from 'vitest';
import { appClusterOptions, testClusterOptions } from '../../infra/local-cluster';
import { databaseUrl } from '../../infra/postgres';

describe('the local clusters', () => {
  it('when both are configured by default, then tests use their own folder and port', () => {
    const app = appClusterOptions({});
    const test = testClusterOptions({});
    expect(test.dataDir).not.toBe(app.dataDir);
    expect(test.port).not.toBe(app.port);
  });

  it('when the cluster is for npm start, then it keeps durability; the test cluster does not', () => {
    expect(appClusterOptions({}).durable).toBe(true);
    expect(testClusterOptions({}).durable).toBe(false);
  });

  it('when a password has URL characters, then the connection URL escapes them', () => {
    const url = databaseUrl({ ...appClusterOptions({}), password: 'p@ss/word' }, 'ebbline');
    expect(new URL(url).password).toBe('p%40ss%2Fword');
  });
});
