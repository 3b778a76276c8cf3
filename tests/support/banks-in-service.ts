import type { Page } from 'playwright-core';
import type { Bank } from '../../shared/schemas/bank';

/** The seeded banks in service (the first 100), through the API as the page's signed-in person. */
export async function banksInService(page: Page): Promise<Bank[]> {
  const list = await page.evaluate(async () => {
    const res = await fetch('/api/banks?pageSize=100&status=in-service', { headers: { Accept: 'application/json' } });
    return (await res.json()) as { items: Bank[] };
  });
  return list.items;
}
