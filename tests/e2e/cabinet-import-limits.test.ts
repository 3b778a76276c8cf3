import { describe, expect, it } from 'vitest';
import { IMPORT_MAX_ROWS, IMPORT_PROBLEMS_LISTED } from '../../shared/constants/register';
import { browsersClosedAfterEach, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

const HEADER =
  'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';

const csvFile = (name: string, rows: string[]) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(`${HEADER}\n${rows.join('\n')}\n`) });

describe('the cabinet import at its limits (planner)', () => {
  it('when a file has more problems than are listed, then the preview lists the first ones and says how many more; a file past the row limit is refused by name', async () => {
    const { page } = await browser();
    // the refused upload's 413 is part of the story
    const console = watchConsole(page, [/ 401 .*\/api\/me$/, / 413 POST .*\/api\/cabinets\/import\/preview$/]);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/import' });
    await page.getByRole('heading', { name: 'Import cabinets from a CSV file' }).waitFor();

    const rows = IMPORT_PROBLEMS_LISTED + 300;
    await page.getByTestId('import-file').setInputFiles(csvFile('many-bad.csv', Array.from({ length: rows }, (_, i) => `M,Line 9,LIM-${i},,,,four hundred,,,,,,,`)));
    await page.getByTestId('import-problems').waitFor();
    await eventually(() => page.getByTestId('import-problem').count()).toBe(IMPORT_PROBLEMS_LISTED);
    await eventually(() => page.getByTestId('import-problems-not-listed').textContent()).toMatch(/300 more problems not listed here \(the first 200 are shown\)/);
    await eventually(() => page.getByTestId('import-problems').locator('caption').textContent()).toMatch(/^500 problems to fix \(the first 200 listed\)/);
    await eventually(() => page.getByTestId('import-summary').textContent()).toMatch(/500 rows.*500 problems/);
    await screenshot(page, 'register-import-capped-problems');

    await page.getByTestId('import-file').setInputFiles({ name: 'million.csv', mimeType: 'text/csv', buffer: Buffer.from(`${HEADER}\n${'x\n'.repeat(1_000_000)}`) });
    await eventually(() => page.getByText('The file could not be read').isVisible()).toBe(true);
    const limit = IMPORT_MAX_ROWS.toLocaleString('en-GB');
    await eventually(() => page.locator('main').textContent()).toContain(`The file has more than ${limit} rows; import at most ${limit} at a time.`);
    expect(await page.getByTestId('import-problems').count()).toBe(0);
    await screenshot(page, 'register-import-row-limit');
    expect(console.problems).toEqual([]);
  });
});
