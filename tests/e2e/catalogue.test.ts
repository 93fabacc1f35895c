/**
 * The propulsion catalogue in a real browser: a CSV with one bad row is refused with that
 * row's error and imports nothing; a good file imports; a viewer sees no editing controls;
 * switching Settings to US customary units shows thrust in lbf (NIST SP 811:
 * 1 lbf = 4.4482216152605 N) and accepts values typed in lbf.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, newContext, screenshot, signIn } from './helpers';
// The e2e project's environment points these at the browser suite's own database.
import { sequelize } from '../../src/lib/server/db/sequelize';
import { CatalogueEntry } from '../../src/lib/server/db/models';

const HEAD = 'name,propellants,isp_sl_s,isp_vac_s,thrust_n,mass_kg,notes';
const csvFile = (name: string, rows: string[]) => ({ name, mimeType: 'text/csv', buffer: Buffer.from([HEAD, ...rows].join('\n') + '\n') });
const rowNames = (page: Page) => page.getByTestId('catalogue-table').locator('tbody th[scope=row]').allTextContents();

describe('propulsion catalogue in a real browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    // Leave the demo catalogue as seeded for the other browser suites.
    await CatalogueEntry.destroy({ where: { name: ['Gorse G-1', 'Heath H-2', 'Ling L-5'] } });
    await sequelize.close();
  });

  it('refuses a CSV with one bad row, naming the row and column, and imports nothing', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    await page.goto('/w/small-launcher');
    await page.getByRole('link', { name: 'Propulsion catalogue' }).click();
    await page.waitForURL('**/w/small-launcher/catalogue');
    const before = await rowNames(page);
    expect(before).toContain('Tallow T-90');
    await screenshot(page, 'catalogue');

    await page.getByLabel('CSV file').setInputFiles(
      csvFile('three-engines.csv', ['Gorse G-1,LOX/RP-1,291,318,480000,520,', 'Gorse G-1V,LOX/RP-1,,3x0,120000,140,', 'Heath H-2,LOX/CH4,305,338,600000,610,'])
    );
    await page.getByRole('button', { name: 'Import' }).click();
    await expect.poll(() => page.getByTestId('import-error').textContent()).toContain('Nothing was imported: 1 problem in three-engines.csv');
    expect(await page.getByTestId('import-row-errors').locator('li').allTextContents()).toEqual(['Row 3, isp_vac_s: Vacuum Isp must be a number']);
    expect(await rowNames(page)).toEqual(before);
    await screenshot(page, 'catalogue-import-refused');

    // A reload shows the same catalogue: nothing was written.
    await page.reload();
    expect(await rowNames(page)).toEqual(before);

    await page.getByLabel('CSV file').setInputFiles(csvFile('two-engines.csv', ['Gorse G-1,LOX/RP-1,291,318,480000,520,', 'Heath H-2,LOX/CH4,305,338,600000,610,Study']));
    await page.getByRole('button', { name: 'Import' }).click();
    await expect.poll(() => page.getByRole('status').textContent()).toContain('Imported 2 entries');
    expect(await rowNames(page)).toEqual(expect.arrayContaining(['Gorse G-1', 'Heath H-2', ...before]));
    const heath = page.getByTestId('catalogue-table').getByRole('row').filter({ hasText: 'Heath H-2' });
    expect((await heath.locator('td').allTextContents()).slice(0, 5)).toEqual(['LOX/CH4', '305', '338', '600', '610']);
  });

  it('adds, edits and deletes an entry with errors beside their fields', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    await page.goto('/w/small-launcher/catalogue');
    await page.getByTestId('add-entry').click();
    await page.getByLabel('Name').fill('Ling L-5');
    await page.getByLabel('Propellants').fill('LOX/RP-1');
    await page.getByLabel('Sea-level Isp').fill('330');
    await page.getByLabel('Vacuum Isp').fill('310');
    await page.getByLabel('Vacuum thrust').fill('50');
    await page.getByLabel('Engine mass').fill('heavy');
    await page.getByRole('button', { name: 'Add entry' }).click();
    await expect.poll(() => page.locator('#entry-mass-error').textContent()).toBe('Engine mass must be a number');
    expect(await page.locator('#entry-ispSeaLevelS-error').textContent()).toBe('Sea-level Isp must be below vacuum Isp');
    expect(await page.getByLabel('Name').inputValue()).toBe('Ling L-5');
    await screenshot(page, 'catalogue-add-errors');

    await page.getByLabel('Sea-level Isp').fill('290');
    await page.getByLabel('Engine mass').fill('75');
    await page.getByRole('button', { name: 'Add entry' }).click();
    const row = page.getByTestId('catalogue-table').getByRole('row').filter({ hasText: 'Ling L-5' });
    await expect.poll(() => row.count()).toBe(1);

    await row.getByRole('link', { name: 'Edit Ling L-5' }).click();
    await page.getByLabel('Vacuum Isp').fill('316');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await expect.poll(async () => (await row.locator('td').allTextContents())[2]).toBe('316');

    page.once('dialog', (d) => void d.accept());
    await row.getByRole('button', { name: 'Delete Ling L-5' }).click();
    await expect.poll(() => row.count()).toBe(0);
  });

  it('shows a viewer the catalogue without any editing control', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'viewer@tarnwick.example');
    await page.goto('/w/small-launcher/catalogue');
    expect(await rowNames(page)).toContain('Tallow T-90');
    for (const name of ['Add entry', 'Import']) expect(await page.getByRole('button', { name }).count()).toBe(0);
    expect(await page.getByRole('link', { name: /^Edit / }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Delete / }).count()).toBe(0);
    expect(await page.getByLabel('CSV file').count()).toBe(0);
    await screenshot(page, 'catalogue-viewer');
  });

  it('shows and reads thrust in lbf and mass in lb once US units are chosen in Settings', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'admin@tarnwick.example');
    await page.goto('/settings');
    await page.getByRole('radio', { name: /^US customary/ }).check();
    await page.getByRole('button', { name: 'Save units' }).click();
    await expect.poll(() => page.getByRole('status').textContent()).toContain('Display units saved');
    await screenshot(page, 'settings');
    try {
      await page.goto('/w/small-launcher/catalogue');
      const headers = await page.getByTestId('catalogue-table').locator('thead th').allTextContents();
      expect(headers).toContain('Vac. thrust (lbf)');
      expect(headers).toContain('Engine mass (lb)');
      const k90 = page.getByTestId('catalogue-table').getByRole('row').filter({ has: page.locator('th', { hasText: /^Tallow T-90$/ }) });
      // 95 000 N / 4.4482216152605 = 21 356.85 lbf; 118 kg / 0.45359237 = 260.15 lb
      expect((await k90.locator('td').allTextContents()).slice(3, 5)).toEqual(['21,357', '260.1']);
      await screenshot(page, 'catalogue-us-units');

      await page.getByRole('link', { name: 'Edit Tallow T-90', exact: true }).click();
      expect(await page.getByLabel('Vacuum thrust').inputValue()).toBe('21356.85');
    } finally {
      await page.goto('/settings');
      await page.getByRole('radio', { name: /^SI/ }).check();
      await page.getByRole('button', { name: 'Save units' }).click();
      await expect.poll(() => page.getByRole('status').textContent()).toContain('Display units saved');
    }
  });
});
