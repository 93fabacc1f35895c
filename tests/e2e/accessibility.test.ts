/**
 * Every main page checked with axe-core (Deque's open-source accessibility engine, from npm)
 * against its WCAG 2.0/2.1 level A and AA rules: labelled controls, names of links and buttons,
 * colour contrast, landmarks, valid ARIA. A page passes with no violation at all.
 */
import { createRequire } from 'node:module';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, newContext, SCREENSHOTS, signIn } from './helpers';

const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const WS = 'small-launcher';
const DEMO_SWEEP = 'Fennel-2 sizing for 500 kg to 500 km SSO';

/** Writes a page group's findings next to the screenshots, for reading the whole list. */
function keep(name: string, found: Record<string, string[]>) {
  mkdirSync(SCREENSHOTS, { recursive: true });
  writeFileSync(join(SCREENSHOTS, `axe-${name}.json`), JSON.stringify(found, null, 2));
}

type Violation = { id: string; impact: string | null; help: string; nodes: { target: string[] }[] };

/** The page's violations as one readable line each (rule, impact, the first offending elements). */
async function audit(page: Page): Promise<string[]> {
  await page.addScriptTag({ content: AXE_SOURCE });
  const violations = (await page.evaluate(async () => {
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const axe = (window as any).axe;
    const r = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
    return r.violations.map((v: Violation) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 4).map((n) => ({ target: n.target })) }));
  })) as Violation[];
  return violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(' | ')}`);
}

describe('accessibility of the main pages (axe-core, WCAG 2.1 A/AA)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('the sign-in page', async () => {
    const page = await (await newContext(browser)).newPage();
    await page.goto('/signin');
    expect(await audit(page)).toEqual([]);
  });

  it("the engineer's pages: dashboard, workspace, studies, builder, sweep, case, compare, report, catalogue, settings", async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    const found: Record<string, string[]> = {};
    const check = async (name: string) => {
      await page.waitForLoadState('networkidle');
      found[name] = await audit(page);
    };
    await check('dashboard');
    await page.goto(`/w/${WS}`);
    await check('workspace');
    await page.goto(`/w/${WS}/studies`);
    await check('studies');
    await page.getByRole('main').getByRole('link').filter({ hasText: 'Fennel-2 upper-stage propulsion trade' }).first().click();
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
    await check('study');
    await page.getByRole('link', { name: DEMO_SWEEP }).first().click();
    await page.waitForURL(/\/sweeps\/\d+$/);
    const sweepUrl = new URL(page.url()).pathname;
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    await page.getByTestId('results-table').locator('tbody tr a').first().waitFor();
    await check('sweep');
    const first = page.getByTestId('results-table').locator('tbody tr').first();
    await first.getByRole('checkbox').check();
    await page.getByTestId('results-table').locator('tbody tr').nth(1).getByRole('checkbox').check();
    await first.getByRole('link').click();
    await page.waitForURL(/\/cases\/\d+$/);
    await page.locator('[data-testid="waterfall"] .apexcharts-canvas').waitFor();
    await check('case');
    await page.goBack();
    await page.getByTestId('results-table').locator('tbody tr').first().getByRole('checkbox').check();
    await page.getByTestId('results-table').locator('tbody tr').nth(1).getByRole('checkbox').check();
    await page.getByTestId('compare-link').click();
    await page.waitForURL(/\/compare\?/);
    await check('compare');
    await page.goto(`${sweepUrl}/report`);
    await check('report');
    await page.goto(`/w/${WS}/sweeps/new`);
    await page.getByTestId('preview-verdict').waitFor();
    await check('builder');
    await page.goto(`/w/${WS}/catalogue`);
    await check('catalogue');
    await page.goto('/settings');
    await check('settings');
    keep('engineer', found);
    expect(found).toEqual(Object.fromEntries(Object.keys(found).map((k) => [k, []])));
  });

  it("the admin's pages (members, outbox, workspace settings) and a share link opened signed out", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, 'admin@tarnwick.example');
    const found: Record<string, string[]> = {};
    for (const path of ['members', 'outbox', 'settings']) {
      await page.goto(`/w/${WS}/${path}`);
      await page.waitForLoadState('networkidle');
      found[path] = await audit(page);
    }
    await page.goto(`/w/${WS}/studies`);
    await page.getByRole('main').getByRole('link').filter({ hasText: 'Fennel-2 upper-stage propulsion trade' }).first().click();
    await page.getByRole('link', { name: DEMO_SWEEP }).first().click();
    await page.waitForURL(/\/sweeps\/\d+$/);
    await page.getByLabel('Label').fill('Accessibility check');
    await page.getByRole('button', { name: 'Create share link' }).click();
    const url = await page.getByTestId('share-url').inputValue();
    const anon = await (await newContext(browser)).newPage();
    await anon.goto(url);
    await anon.waitForLoadState('networkidle');
    found.share = await audit(anon);
    keep('admin', found);
    expect(found).toEqual(Object.fromEntries(Object.keys(found).map((k) => [k, []])));
  });
});
