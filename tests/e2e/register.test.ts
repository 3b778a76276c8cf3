import { describe, expect, inject, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

const browser = browsersClosedAfterEach();

const HEADER =
  'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';

function csvFile(name: string, rows: string[]) {
  return { name, mimeType: 'text/csv', buffer: Buffer.from([HEADER, ...rows].join('\r\n') + '\r\n') };
}

describe('the register (planner)', () => {
  it('when a planner adds a site, an area, a cabinet and a bank through the forms, then each page shows it, with field messages on the way', async () => {
    const { page } = await browser();
    const console = watchConsole(page);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/sites' });
    await page.getByRole('heading', { name: 'Register' }).waitFor();
    await screenshot(page, 'register-sites-desktop');

    // a site
    await page.getByRole('link', { name: 'Add site' }).click();
    await page.getByLabel('Name').fill('Quarrymoor Depot');
    await page.getByRole('button', { name: 'Add site' }).click();
    await page.getByTestId('error-code').waitFor();
    await eventually(() => page.getByTestId('error-code').textContent()).toMatch(/letters or digits/);
    await page.getByLabel('Code').fill('q');
    await page.getByLabel('Time zone').fill('Europe/London');
    await page.getByRole('button', { name: 'Add site' }).click();
    await page.getByRole('heading', { name: 'Quarrymoor Depot' }).waitFor();

    // an area of it
    await page.getByRole('link', { name: 'Add area' }).click();
    await page.getByLabel('Name').fill('Crusher hall');
    await page.getByLabel('What is there').fill('Jaw crushers and conveyors; very dusty');
    await page.getByRole('button', { name: 'Add area' }).click();
    await page.getByRole('heading', { name: 'Crusher hall' }).waitFor();

    // a cabinet in that area: the site and area come chosen
    await page.getByRole('link', { name: 'Add cabinet' }).click();
    await page.getByRole('textbox', { name: 'Tag', exact: true }).fill('BRK-Q1-VFD-001');
    await expect.poll(() => page.getByLabel('Area').inputValue()).not.toBe('');
    await page.getByRole('button', { name: 'Add cabinet' }).click();
    await page.getByTestId('error-supplyVolts').waitFor();
    await eventually(() => page.getByTestId('error-supplyVolts').textContent()).toBe('Enter the supply voltage as a number.');
    await screenshot(page, 'register-cabinet-form-errors');
    await page.getByLabel('Supply voltage (AC line)').fill('400');
    await page.getByLabel('Nominal DC-bus voltage').fill('540');
    await page.getByLabel('Drive make').fill('Tarnwick Drives');
    await page.getByLabel('Drive model').fill('TW-55');
    await page.getByLabel('Marked discharge wait time').fill('10');
    await page.getByLabel('Criticality').selectOption('high');
    await page.getByRole('button', { name: 'Add cabinet' }).click();
    await page.getByRole('heading', { name: 'BRK-Q1-VFD-001' }).waitFor();
    const cabinetUrl = page.url();

    // a bank in it, with its nameplate baseline
    await page.getByRole('link', { name: 'Add bank' }).click();
    await page.getByLabel('Position').fill('Drive 1 DC link');
    const design = page.getByLabel('Bank design');
    await design.locator('option', { hasText: 'EL-2S3P-4700' }).waitFor({ state: 'attached' });
    await design.selectOption({ label: 'EL-2S3P-4700: Series pairs, 3 strings of 4700 µF / 450 V' });
    await page.getByTestId('nameplate-preview').filter({ hasText: '7,050 µF' }).waitFor();
    await page.getByLabel('Installed on').fill('2024-05-02');
    await page.getByRole('button', { name: 'Add bank' }).click();
    await page.getByRole('heading', { name: 'Drive 1 DC link' }).waitFor();
    const baseline = () => page.getByTestId('baseline').textContent();
    await eventually(baseline).toContain('7,050 µF');
    await eventually(baseline).toContain('from nameplate');
    await eventually(baseline).toContain('Tomas Keelan');
    await screenshot(page, 'register-bank-desktop');

    await page.goto(cabinetUrl);
    const row = page.getByTestId('table-row').filter({ hasText: 'Drive 1 DC link' });
    await row.waitFor();
    await eventually(() => row.textContent()).toContain('—');
    await page.getByTestId('audit-entry').first().waitFor();
    await screenshot(page, 'register-cabinet-desktop');
    expect(console.problems).toEqual([]);
  });

  it('when someone else saved the cabinet first, then the form says so and offers their version', async () => {
    const first = await browser();
    await signIn(first.page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets?q=BRK-M1-VFD-001' });
    await first.page.getByRole('link', { name: 'BRK-M1-VFD-001' }).first().click();
    await first.page.getByRole('link', { name: 'Edit' }).click();
    await first.page.getByLabel('Location').fill('Line 1, bay 2 (moved)');

    const second = await first.context.newPage();
    await second.goto(first.page.url());
    await second.getByLabel('Location').fill('Line 1, bay 9');
    await second.getByRole('button', { name: 'Save changes' }).click();
    await second.getByRole('heading', { name: 'BRK-M1-VFD-001' }).waitFor();

    await first.page.getByRole('button', { name: 'Save changes' }).click();
    const problem = first.page.getByTestId('save-problem');
    await problem.waitFor();
    await eventually(() => problem.textContent()).toContain('Someone else changed this cabinet first');
    await screenshot(first.page, 'register-conflict');
    await first.page.getByRole('button', { name: /Load their version/ }).click();
    await expect.poll(() => first.page.getByLabel('Location').inputValue()).toBe('Line 1, bay 9');
  });

  it('when a planner imports a CSV with a bad row, then the preview names the row, column and reason, and the fixed file imports', async () => {
    const { page } = await browser();
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets' });
    await page.getByRole('link', { name: 'Import CSV' }).click();
    await page.getByRole('heading', { name: 'Import cabinets from a CSV file' }).waitFor();

    await page.getByTestId('import-file').setInputFiles(
      csvFile('marrowgate-line-5.csv', [
        'M,Line 5 extrusion,BRK-M5-VFD-001,Bay 1,Tarnwick Drives,TW-55,400,540,55,10,high,,2023-02-01,in-service',
        'M,Line 5 extrusion,BRK-M5-VFD-002,Bay 2,Tarnwick Drives,TW-55,4OO,540,55,10,high,,2023-02-01,in-service',
        'M,Line 5 extrusion,BRK-M5-VFD-003,Bay 3,Quellbrook Motion,QM-75,480,650,75,10,medium,,2023-02-01,in-service',
      ]),
    );
    const problem = page.getByTestId('import-problem');
    await problem.first().waitFor();
    await eventually(() => problem.count()).toBe(1);
    await eventually(() => problem.first().getAttribute('data-row')).toBe('3');
    await eventually(() => problem.first().getAttribute('data-column')).toBe('supply_volts');
    await eventually(() => problem.first().textContent()).toContain('supply voltage is missing or not a number');
    await eventually(() => page.getByRole('button', { name: 'Import 3 cabinets' }).isDisabled()).toBe(true);
    await screenshot(page, 'register-import-problems');

    await page.getByTestId('import-file').setInputFiles(
      csvFile('marrowgate-line-5.csv', [
        'M,Line 5 extrusion,BRK-M5-VFD-001,Bay 1,Tarnwick Drives,TW-55,400,540,55,10,high,,2023-02-01,in-service',
        'M,Line 5 extrusion,BRK-M5-VFD-002,Bay 2,Tarnwick Drives,TW-55,400,540,55,10,high,,2023-02-01,in-service',
        'M,Line 5 extrusion,BRK-M5-VFD-003,Bay 3,Quellbrook Motion,QM-75,480,650,75,10,medium,,2023-02-01,in-service',
      ]),
    );
    await page.getByTestId('import-summary').filter({ hasText: '3 ready' }).waitFor();
    await page.getByRole('button', { name: 'Import 3 cabinets' }).click();
    await page.getByTestId('import-done').waitFor();
    await eventually(() => page.getByTestId('import-done').textContent()).toContain('3 cabinets from marrowgate-line-5.csv');
    await screenshot(page, 'register-import-done');

    await page.goto(`${baseUrl}/register/cabinets?q=BRK-M5-VFD`);
    await page.getByTestId('list-total').filter({ hasText: 'of 3' }).waitFor();
  });

  it('when a planner prints a cabinet label, then it shows the tag and a QR code that opens the cabinet’s page', async () => {
    const { page } = await browser();
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets?q=BRK-H2-VFD-001' });
    await page.getByRole('link', { name: 'BRK-H2-VFD-001' }).first().click();
    await page.getByRole('heading', { name: 'BRK-H2-VFD-001' }).waitFor();
    // the cabinet page speaks of the marked wait time, so it carries the discharge caution
    await eventually(() => page.getByTestId('discharge-caution').textContent()).toContain('Only qualified persons');
    const cabinetPath = new URL(page.url()).pathname;
    await page.getByRole('link', { name: 'Print label' }).click();
    const label = page.getByTestId('cabinet-label').first();
    await label.waitFor();
    await eventually(() => label.textContent()).toContain('BRK-H2-VFD-001');
    await eventually(() => label.textContent()).toMatch(/Qualified persons only.*rated meter/);
    await eventually(() => page.getByTestId('label-url').textContent()).toBe(`${baseUrl}${cabinetPath}`);
    const qrWidth = await page.getByTestId('label-qr').first().evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth);
    expect(qrWidth).toBeGreaterThan(0);
    await screenshot(page, 'register-label-screen');

    await page.evaluate(() => {
      (window as unknown as { printed: boolean }).printed = false;
      window.print = () => {
        (window as unknown as { printed: boolean }).printed = true;
      };
    });
    await page.getByRole('button', { name: 'Print label' }).click();
    await eventually(() => page.evaluate(() => (window as unknown as { printed: boolean }).printed)).toBe(true);
    // what the printer gets: the label alone
    await page.emulateMedia({ media: 'print' });
    await eventually(() => page.locator('.ebbline-label-print [data-testid="cabinet-label"]').isVisible()).toBe(true);
    expect(await page.getByRole('heading', { name: 'Register' }).isVisible()).toBe(false);
    await page.screenshot({ path: '.data/screenshots/register-label-print.png' });
  });
});

describe('the register (technician)', () => {
  it('when a technician opens the register on a phone, then it reads it and cannot change it', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/register/cabinets' });
    await page.getByRole('heading', { name: 'Register' }).waitFor();
    await page.getByTestId('read-only-note').waitFor();
    await eventually(() => page.getByRole('link', { name: 'Add cabinet' }).count()).toBe(0);
    await eventually(() => page.getByRole('link', { name: 'Import CSV' }).count()).toBe(0);
    await page.getByPlaceholder('Tag, e.g. M2-VFD-014').fill('S2-VFD');
    await page.getByTestId('list-total').filter({ hasText: /^1–\d+ of \d+$/ }).waitFor();
    await expect.poll(async () => (await page.getByRole('list', { name: 'Cabinets' }).getByRole('link').allTextContents()).every((t) => t.includes('S2-VFD'))).toBe(true);
    await screenshot(page, 'register-cabinets-phone');

    await page.getByRole('list', { name: 'Cabinets' }).getByRole('link').first().click();
    await page.getByRole('link', { name: 'Print label' }).waitFor();
    await page.getByRole('list', { name: 'Banks' }).getByText('Drive 1 DC link').first().waitFor();
    await eventually(() => page.getByRole('link', { name: 'Edit' }).count()).toBe(0);
    await eventually(() => page.getByRole('button', { name: 'Retire' }).count()).toBe(0);
    await eventually(() => page.getByRole('link', { name: 'Add bank' }).count()).toBe(0);
    await eventually(() => page.getByRole('link', { name: 'Print label' }).count()).toBe(1);
    await screenshot(page, 'register-cabinet-phone');

    await page.goto(`${baseUrl}/register/cabinets/new`);
    await page.getByTestId('read-only-note').waitFor();
    await eventually(() => page.getByRole('button', { name: 'Add cabinet' }).count()).toBe(0);

    await page.goto(`${baseUrl}/register/spares?overdue=true`);
    await page.getByRole('list', { name: 'Spares' }).waitFor();
    await screenshot(page, 'register-spares-phone');
    expect(console.problems).toEqual([]);
  });
});

describe('the register on a phone (planner)', () => {
  it('when a planner opens the forms, a bank and the import on a 390 px screen, then nothing is wider than the screen', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    const fits = () => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/new' });
    await page.getByRole('button', { name: 'Add cabinet' }).waitFor();
    expect(await fits()).toBe(true);
    await screenshot(page, 'register-cabinet-form-phone');

    await page.goto(`${baseUrl}/register/banks?q=BRK-M3`);
    await page.getByRole('list', { name: 'Banks' }).getByRole('link').first().click();
    await page.getByTestId('baseline').waitFor();
    expect(await fits()).toBe(true);
    await screenshot(page, 'register-bank-phone');

    await page.goto(`${baseUrl}/register/cabinets/import`);
    await page.getByTestId('import-file').setInputFiles(
      csvFile('hollin-additions.csv', ['H,Silo top,BRK-H2-VFD-101,,,,four hundred,,,,,,,', 'X,Silo top,BRK-H2-VFD-102,,,,400,,,,,,,']),
    );
    await page.getByTestId('import-problems').waitFor();
    await eventually(() => page.getByTestId('import-problem').count()).toBe(2);
    await screenshot(page, 'register-import-phone');
    expect(console.problems).toEqual([]);
  });
});

describe('the register (reliability engineer)', () => {
  it('when a reliability engineer changes a design’s watch limit, then it becomes a new revision and the old one stays', async () => {
    const { page } = await browser();
    await signIn(page, 'ines', 'tidewater-rel', { returnTo: '/register/bank-designs?q=EL-2S2P' });
    await page.getByRole('link', { name: 'EL-2S2P-3300' }).first().click();
    await page.getByRole('link', { name: 'Edit' }).click();
    await page.getByLabel('Watch below').fill('0.92');
    await page.getByLabel('Why the change').fill('Tighter watch after the fleet review');
    await page.getByRole('button', { name: 'Save changes' }).click();
    const revisions = page.getByTestId('revisions');
    await revisions.filter({ hasText: 'Revision 2' }).waitFor();
    await eventually(() => revisions.textContent()).toContain('Revision 1');
    await eventually(() => revisions.textContent()).toContain('Tighter watch after the fleet review');
    await screenshot(page, 'register-design-desktop');

    // what the engineer reads elsewhere in the register
    await page.goto(`${baseUrl}/register/cabinets`);
    await page.getByTestId('list-total').filter({ hasText: /of [\d,]+/ }).waitFor();
    await screenshot(page, 'register-cabinets-desktop');
    await page.goto(`${baseUrl}/register/banks`);
    await page.getByTestId('list-total').filter({ hasText: /of [\d,]+/ }).waitFor();
    await screenshot(page, 'register-banks-desktop');
    await page.goto(`${baseUrl}/register/spares?overdue=true`);
    await page.getByTestId('table-row').first().getByRole('link').click();
    await page.getByText('Reforming due').first().waitFor();
    await screenshot(page, 'register-spare-desktop');
  });
});
