/**
 * The engineer's main path and the viewer's limits, in a real browser against the built app,
 * a real worker, MariaDB and Redis (global-setup.ts): sign in, build a small sweep, watch it
 * finish, read the front, open a case, share the report, open the link signed out; a viewer
 * sees no editing controls and the server refuses a forged request.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, launchBrowser, newContext, screenshot, signIn } from './helpers';

const WS = 'small-launcher';
const CAUTION = 'Flight, range-safety and licensing decisions belong to qualified engineers and the applicable authorities';
/** Visible text with whitespace runs collapsed (markup line breaks inside sentences). */
async function text(page: Page, testId: string): Promise<string> {
  return ((await page.getByTestId(testId).first().textContent()) ?? '').replace(/\s+/g, ' ').trim();
}

describe('sweeps in a real browser', () => {
  let browser: Browser;
  let sweepUrl = '';
  let shareUrl = '';

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  async function waitForStatus(page: Page, status: string, timeout = 90_000) {
    await page.getByTestId('sweep-status').filter({ hasText: status }).first().waitFor({ timeout });
  }

  it('an engineer builds a small sweep, watches it finish, reads the front and opens a case', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');

    // A study to hold the sweep.
    await page.goto(`/w/${WS}/studies`);
    await page.getByRole('button', { name: 'New study' }).click();
    await page.getByLabel('Name').fill('Small launcher structure trade');
    await page.getByLabel('Question').fill('How light can the two-stage launcher get with better structures?');
    await Promise.all([page.waitForURL(/\/studies\/[0-9a-f-]{36}$/), page.getByRole('button', { name: 'Create study' }).click()]);
    expect(await page.getByTestId('study-title').textContent()).toBe('Small launcher structure trade');

    // The builder: starts from a valid spec, counts the cases live, previews the baseline.
    await page.getByRole('main').getByRole('link', { name: 'New sweep' }).first().click();
    await page.waitForURL(/\/sweeps\/new\?study=/);
    await page.locator('#f-name').fill('Structure and T/W, small grid');
    // The question starts as the study's.
    expect(await page.getByLabel('Question this sweep answers').inputValue()).toBe('How light can the two-stage launcher get with better structures?');
    await expect.poll(() => text(page, 'case-count')).toBe('75');
    await expect.poll(() => text(page, 'preview-glow'), { timeout: 15_000 }).toMatch(/\d[\d,]* kg/);
    // The starting baseline is a vehicle that closes.
    expect(await text(page, 'preview-verdict')).toBe('Feasible');

    // A bad value is named beside its field, and the form is not sent.
    const payload = page.getByLabel(/Required payload/);
    await payload.fill('-5');
    await payload.blur();
    await expect.poll(() => page.locator('#f-payload-error').textContent()).toContain('payload mass must be greater than 0');
    await page.getByRole('button', { name: 'Create and run' }).click();
    await expect.poll(() => text(page, 'form-error-count')).toContain('1 field needs attention');
    expect(new URL(page.url()).pathname).toBe(`/w/${WS}/sweeps/new`);
    await screenshot(page, 'builder-error');
    await payload.fill('400');

    // Make the sweep smaller: the last parameter (lift-off T/W) to three values.
    await page.getByLabel('Number of values').last().fill('3');
    await expect.poll(() => text(page, 'case-count')).toBe('45');
    await screenshot(page, 'builder');

    await Promise.all([page.waitForURL(/\/sweeps\/\d+$/), page.getByRole('button', { name: 'Create and run' }).click()]);
    sweepUrl = new URL(page.url()).pathname;
    expect(await page.getByTestId('sweep-title').textContent()).toBe('Structure and T/W, small grid');
    await expect.poll(() => text(page, 'caution')).toContain(CAUTION);

    // Progress updates live until the sweep completes.
    await waitForStatus(page, 'completed');
    await expect.poll(() => text(page, 'progress-text')).toContain('45 of 45 cases');
    await expect.poll(() => text(page, 'front-info'), { timeout: 15_000 }).toMatch(/\d+ cases? on the front/);
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    // The whole sweep is in the table: 45 rows over two pages of 25.
    await expect.poll(() => text(page, 'table-count')).toContain('of 45');
    await page.getByTestId('sensitivity').waitFor();
    await screenshot(page, 'sweep-completed');

    // Clicking a point of the front opens its case.
    const box = await page.locator('[data-testid="pareto-plot"] .apexcharts-series').last().locator('.apexcharts-marker').first().boundingBox();
    expect(box).not.toBeNull();
    await Promise.all([page.waitForURL(/\/cases\/\d+$/), page.mouse.click(box!.x + box!.width / 2, box!.y + box!.height / 2)]);
    expect(await page.getByTestId('case-feasible').textContent()).toBe('Feasible');
    await page.goBack();
    await page.getByTestId('results-table').locator('tbody tr').first().waitFor();

    // Column filters in the row under the headers, on the whole sweep (sorted by case number: a
    // page sorted by rank leaves out the unranked infeasible cases). A range that is not a number
    // is named beside its column.
    const rows = async () => Number((await text(page, 'table-count')).match(/of ([\d,]+)/)?.[1].replace(/,/g, '') ?? 0);
    const results = page.getByTestId('results-table');
    await results.getByRole('button', { name: 'Case', exact: true }).click();
    await expect.poll(rows).toBe(45);
    const glowFrom = results.getByLabel(/^GLOW \(kg\) from$/);
    await glowFrom.fill('heavy');
    await expect.poll(() => glowFrom.getAttribute('aria-invalid')).toBe('true');
    await expect.poll(() => text(page, 'filter-row')).toContain('GLOW (kg) from must be a number');
    await glowFrom.fill('');
    // No vehicle lifts off at 1 kg or less.
    await results.getByLabel(/^GLOW \(kg\) to$/).fill('1');
    await expect.poll(() => text(page, 'results-table')).toContain('No case matches these filters.');
    await results.getByLabel(/^GLOW \(kg\) to$/).fill('');
    // Five first-stage structural coefficients × three upper-stage engines × three T/W: one engine keeps 15.
    await results.getByLabel('Stage 2 propulsion filter').selectOption({ index: 1 });
    await expect.poll(rows).toBe(15);
    await screenshot(page, 'results-filtered');
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await expect.poll(rows).toBe(45);

    // Server-side sort: rank ascending puts front members (rank 1) first.
    await results.getByRole('button', { name: 'Rank', exact: true }).click();
    await expect.poll(() => page.locator('[data-testid="results-table"] tbody tr').first().locator('td').nth(1).textContent()).toBe('1');
    // Feasible only shrinks the count or keeps it; never grows it.
    await results.getByLabel('Feasible filter').selectOption('yes');
    await expect.poll(rows).toBeLessThanOrEqual(45);
    await expect.poll(() => page.locator('[data-testid="results-table"] tbody tr').first().locator('td').nth(1).textContent()).toBe('1');

    // Open the first front case from the table.
    const firstCase = page.locator('[data-testid="results-table"] tbody tr').first().getByRole('link');
    const caseNo = (await firstCase.textContent())!.trim();
    await Promise.all([page.waitForURL(new RegExp(`/cases/${caseNo}$`)), firstCase.click()]);
    expect(await page.getByTestId('case-title').textContent()).toBe(`Case ${caseNo}`);
    expect(await page.getByTestId('case-feasible').textContent()).toBe('Feasible');
    await page.locator('[data-testid="waterfall"] .apexcharts-canvas').waitFor();
    const budget = await page.getByTestId('budget-table').textContent();
    expect(budget).toContain('Insertion speed');
    expect(budget).toContain('allowance');
    expect(await page.getByTestId('stage-table').locator('tbody tr').count()).toBe(2);
    expect(await text(page, 'caution')).toContain(CAUTION);
    await screenshot(page, 'case');

    // Compare it with two more cases.
    await page.goto(`${sweepUrl}/compare?i=${caseNo},0,1`);
    expect(await page.getByTestId('compare-table').locator('thead th').count()).toBe(4);
    await screenshot(page, 'compare');

    // Clone: the builder opens with the frozen spec and the same case count.
    await page.goto(sweepUrl);
    await Promise.all([page.waitForURL(/\/sweeps\/new\?clone=\d+$/), page.getByRole('link', { name: 'Clone' }).click()]);
    expect(await page.locator('#f-name').inputValue()).toBe('Structure and T/W, small grid (copy)');
    await expect.poll(() => text(page, 'case-count')).toBe('45');
  });

  it('an engineer pauses, resumes and cancels a long sweep while its progress updates', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    await page.goto(`/w/${WS}/sweeps/new`);
    await page.locator('#f-name').fill('Long sampled sweep');
    await page.getByLabel('Latin hypercube sample').check();
    await page.getByLabel('Samples').fill('400000');
    await expect.poll(() => text(page, 'case-count')).toBe('400,000');
    await expect.poll(() => text(page, 'time-estimate')).toMatch(/^about \d+ (s|min|h)/);
    await Promise.all([page.waitForURL(/\/sweeps\/\d+$/), page.getByRole('button', { name: 'Create and run' }).click()]);

    await page.getByRole('button', { name: 'Pause' }).click();
    await waitForStatus(page, 'paused', 20_000);
    const pausedAt = await text(page, 'progress-text');
    await screenshot(page, 'sweep-paused');
    await page.getByRole('button', { name: 'Resume' }).click();
    await page.getByTestId('sweep-status').filter({ hasText: /queued|running|completed/ }).first().waitFor({ timeout: 20_000 });
    // Progress moves on after the resume (or the sweep finished meanwhile).
    await expect
      .poll(async () => (await text(page, 'progress-text')) !== pausedAt || (await text(page, 'sweep-status')) === 'completed', { timeout: 30_000 })
      .toBe(true);
    const status = await text(page, 'sweep-status');
    if (status !== 'completed') {
      await page.getByRole('button', { name: 'Cancel sweep' }).click();
      await waitForStatus(page, 'cancelled', 20_000);
      expect(await page.getByRole('button', { name: 'Pause' }).count()).toBe(0);
      // What was evaluated before the cancel is shown: the table and the front reload once it stops.
      const done = (await text(page, 'progress-text')).match(/^([\d,]+) of/)![1];
      expect(Number(done.replace(/,/g, ''))).toBeGreaterThan(0);
      await expect.poll(() => text(page, 'table-count')).toContain(`of ${done}`);
      await expect.poll(() => text(page, 'front-info')).toMatch(/[1-9][\d,]* cases? on the front of the cases evaluated before it stopped/);
    }

    // Its owner deletes it, after confirming; the study page says so and no longer lists it.
    const id = new URL(page.url()).pathname.split('/').pop();
    await page.getByRole('button', { name: 'Delete sweep' }).click();
    await page.getByRole('button', { name: 'Keep it' }).click();
    expect(await page.getByRole('button', { name: 'Delete permanently' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Delete sweep' }).click();
    await screenshot(page, 'sweep-delete-confirm');
    await Promise.all([page.waitForURL(/\/studies\/[0-9a-f-]{36}\?deleted=/), page.getByRole('button', { name: 'Delete permanently' }).click()]);
    expect(await text(page, 'deleted-notice')).toBe('Deleted the sweep “Long sampled sweep” and its cases.');
    expect(await page.locator(`a[href$="/sweeps/${id}"]`).count()).toBe(0);
    expect((await page.request.get(`/api/sweeps/${id}`)).status()).toBe(404);
  });

  it('the server checks the spec with the same schema and names the field', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signIn(page, 'engineer@tarnwick.example');
    // The spec of the sweep just run, made invalid the way a hand-edited file would be.
    const id = sweepUrl.split('/').pop();
    const sweep = await (await ctx.request.get(`/api/sweeps/${id}`)).json();
    const spec = structuredClone(sweep.spec);
    spec.baseline.stages[0].propulsion.ispVacuum = 100; // below its sea-level Isp
    const res = await ctx.request.post(`/w/${WS}/sweeps/new?/create`, {
      form: { studyId: sweep.studyId, spec: JSON.stringify(spec), intent: 'run' },
      headers: { origin: BASE_URL, accept: 'application/json', 'x-sveltekit-action': 'true' }
    });
    const body = await res.json();
    expect(body.type).toBe('failure');
    expect(body.status).toBe(400);
    // SvelteKit serialises action data with devalue; the message and its field key are in it.
    expect(body.data).toContain('baseline.stages.0.propulsion.ispVacuum');
    expect(body.data).toContain('vacuum Isp must be at least the sea-level Isp');
    const before = (await (await ctx.request.get(`/api/sweeps?workspace=${WS}&limit=200`)).json()).total;
    const notJson = await ctx.request.post(`/w/${WS}/sweeps/new?/create`, {
      form: { studyId: sweep.studyId, spec: '{ not json', intent: 'run' },
      headers: { origin: BASE_URL, accept: 'application/json', 'x-sveltekit-action': 'true' }
    });
    expect((await notJson.json()).data).toContain('the specification is not valid JSON');
    const after = (await (await ctx.request.get(`/api/sweeps?workspace=${WS}&limit=200`)).json()).total;
    expect(after).toBe(before);
  });

  it('the engineer shares the report, and the link opens it signed out and shows nothing else', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    await page.goto(`${sweepUrl}/report`);
    expect(await page.getByTestId('report-title').textContent()).toBe('Structure and T/W, small grid');
    expect(await page.getByTestId('report-model').textContent()).toMatch(/\S/);
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    expect(await page.getByTestId('report-top').locator('tbody tr').count()).toBeGreaterThan(0);
    await screenshot(page, 'report');

    await page.goto(sweepUrl);
    await page.getByLabel('Label').fill('For the programme review');
    // The engineer's own setting is SI; this report is shared in US customary units.
    expect(await page.getByLabel('Units in the report').inputValue()).toBe('si');
    await page.getByLabel('Units in the report').selectOption('us');
    await page.getByRole('button', { name: 'Create share link' }).click();
    shareUrl = await (await page.getByTestId('share-url').elementHandle())!.inputValue();
    expect(shareUrl).toMatch(new RegExp(`^${BASE_URL}/share/[A-Za-z0-9_-]{43}$`));
    await expect.poll(() => text(page, 'share-links')).toContain('For the programme review');
    expect(await text(page, 'share-links')).toContain('US customary');

    // A fresh browser context: no session cookie.
    const anon = await (await newContext(browser)).newPage();
    await anon.goto(shareUrl);
    expect(new URL(anon.url()).pathname).toMatch(/^\/share\//);
    expect(await anon.getByTestId('report-title').textContent()).toBe('Structure and T/W, small grid');
    expect(await text(anon, 'report-question')).toBe('How light can the two-stage launcher get with better structures?');
    expect(await text(anon, 'caution')).toContain(CAUTION);
    await anon.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    // Nothing else: no links into the app, and the app itself still asks for a sign-in.
    expect(await anon.locator('a[href^="/w/"], a[href^="/api/"]').count()).toBe(0);
    await screenshot(anon, 'share-report');
    // In the link's units, and the reader switches to SI from the keyboard.
    const top = () => text(anon, 'report-top');
    expect(await top()).toContain('(lb)');
    expect(await top()).not.toContain('(kg)');
    const units = anon.getByTestId('share-units');
    expect(await units.getByRole('link', { name: 'US customary', exact: true }).getAttribute('aria-current')).toBe('true');
    await units.getByRole('link', { name: 'SI', exact: true }).focus();
    await anon.keyboard.press('Enter');
    await expect.poll(() => new URL(anon.url()).search).toBe('?units=si');
    await expect.poll(top).toContain('(kg)');
    expect(await top()).not.toContain('(lb)');
    expect(await units.getByRole('link', { name: 'SI', exact: true }).getAttribute('aria-current')).toBe('true');
    expect(await anon.locator('a[href^="/w/"], a[href^="/api/"]').count()).toBe(0);
    await screenshot(anon, 'share-report-si');
    const res = await anon.request.get(`${BASE_URL}/api${sweepUrl.replace(`/w/${WS}`, '')}`, { maxRedirects: 0 });
    expect(res.status()).toBe(401);
    await anon.goto(sweepUrl);
    expect(new URL(anon.url()).pathname).toBe('/signin');

    // Revoked: the same link no longer opens.
    await page.reload();
    await page.getByTestId('share-links').getByRole('button', { name: 'Revoke' }).first().click();
    await expect.poll(() => text(page, 'share-links')).toContain('revoked');
    const again = await anon.goto(shareUrl);
    expect(again?.status()).toBe(404);
    expect(await anon.getByTestId('share-error').textContent()).toBe('Share link unavailable');
  });

  it('a viewer sees no editing controls, and forged requests are refused', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signIn(page, 'viewer@tarnwick.example');
    await page.goto(sweepUrl);
    expect(await page.getByTestId('sweep-title').textContent()).toBe('Structure and T/W, small grid');
    await page.getByTestId('results-table').locator('tbody tr').first().waitFor();
    for (const name of ['Cancel sweep', 'Pause', 'Resume', 'Clone', 'Create share link', 'Delete sweep']) {
      expect(await page.getByRole('button', { name, exact: true }).count(), name).toBe(0);
      expect(await page.getByRole('link', { name, exact: true }).count(), name).toBe(0);
    }
    expect(await page.getByText('Share links', { exact: true }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'New sweep' }).count()).toBe(0);
    await screenshot(page, 'sweep-viewer');

    await page.goto(`/w/${WS}/studies`);
    expect(await page.getByRole('button', { name: 'New study' }).count()).toBe(0);

    // The builder is refused, and so are the writes, with the viewer's own session cookie.
    const builder = await page.goto(`/w/${WS}/sweeps/new`);
    expect(builder?.status()).toBe(403);
    const id = sweepUrl.split('/').pop();
    const cancel = await ctx.request.post(`/api/sweeps/${id}/cancel`);
    expect(cancel.status()).toBe(403);
    const share = await ctx.request.post(`${sweepUrl}?/share`, {
      form: { label: 'sneaky', days: '30' },
      headers: { origin: BASE_URL, accept: 'text/html' }
    });
    expect(share.status()).toBe(403);
    const del = await ctx.request.post(`${sweepUrl}?/delete`, { form: { sure: 'yes' }, headers: { origin: BASE_URL, accept: 'text/html' } });
    expect(del.status()).toBe(403);
    expect((await ctx.request.get(`/api/sweeps/${id}`)).status()).toBe(200);
    const create = await ctx.request.post('/api/sweeps', { data: { studyId: '00000000-0000-4000-8000-000000000000', spec: {} } });
    expect([403, 404]).toContain(create.status());

    // A cross-site form post with the engineer's session is refused by the origin check.
    const eng = await newContext(browser);
    const ep = await eng.newPage();
    await signIn(ep, 'engineer@tarnwick.example');
    const forged = await eng.request.post(`${sweepUrl}?/share`, {
      form: { label: 'forged', days: '30' },
      headers: { origin: 'http://evil.example', accept: 'text/html' }
    });
    expect(forged.status()).toBe(403);
    await ep.goto(sweepUrl);
    expect(await ep.getByTestId('share-links').textContent()).not.toContain('forged');
  });
});
