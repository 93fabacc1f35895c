/**
 * The Pareto plot in a real browser against the built app, on the demo sweep seeded by
 * global-setup.ts (GLOW against max axial acceleration, with a GLOW ceiling and an
 * acceleration limit given in g): reached with Tab, stepped with the arrow keys, the case
 * announced and ringed, opened with Enter; both limits drawn as dashed lines, on the sweep
 * page and in the report.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { SCREENSHOTS, launchBrowser, newContext, screenshot, signIn } from './helpers';

const WS = 'small-launcher';
const DEMO = 'Fennel-2 sizing for 500 kg to 500 km SSO';

async function text(page: Page, testId: string): Promise<string> {
  return ((await page.getByTestId(testId).first().textContent()) ?? '').replace(/\s+/g, ' ').trim();
}

describe('the Pareto plot in a real browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('is reached with Tab, steps through the front with the arrow keys and opens the case with Enter', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    const list = await (await page.request.get(`/api/sweeps?workspace=${WS}&limit=200`)).json();
    const demo = list.sweeps.find((s: { name: string }) => s.name === DEMO);
    expect(demo, 'the seeded demo sweep').toBeTruthy();
    // The front as the API gives it: the case with the lowest GLOW is the first from the left.
    const front = (await (await page.request.get(`/api/sweeps/${demo.id}/front`)).json()).cases as { caseIndex: number; values: { glow: number } }[];
    expect(front.length).toBeGreaterThan(1);
    const lightest = front.reduce((a, b) => (b.values.glow < a.values.glow ? b : a));

    await page.goto(`/w/${WS}/sweeps/${demo.id}`);
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();

    // The spec's limits on the plotted axes, in words and as dashed lines with their labels.
    // 6 g × 9.80665 m/s² = 58.84 m/s² (standard gravity, exact).
    await expect
      .poll(() => text(page, 'pareto-limits'))
      .toBe('Constraint limits (dashed lines): GLOW ceiling 45,000 kg, infeasible to the right; axial acceleration limit 6 g (58.84 m/s²), infeasible above.');
    const plot = page.getByTestId('pareto-plot');
    await expect.poll(() => plot.locator('.apexcharts-xaxis-annotations line[stroke-dasharray="6"]').count()).toBe(1);
    await expect.poll(() => plot.locator('.apexcharts-yaxis-annotations line[stroke-dasharray="6"]').count()).toBe(1);
    expect(await plot.locator('.apexcharts-xaxis-annotation-label').filter({ hasText: 'GLOW ceiling 45,000 kg · infeasible →' }).count()).toBe(1);
    expect(await plot.locator('.apexcharts-yaxis-annotation-label').filter({ hasText: 'axial acceleration limit 6 g (58.84 m/s²) · infeasible above' }).count()).toBe(1);

    // One Tab from the last axis control lands on the plot.
    await page.locator('#ax-c').focus();
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('pareto-keys');
    await page.keyboard.press('ArrowRight');
    await expect
      .poll(() => text(page, 'pareto-announce'))
      .toMatch(new RegExp(`^Case ${lightest.caseIndex}, 1 of ${front.length} on the front from the left: Gross lift-off mass [\\d,]+ kg; Max axial acceleration [\\d.]+ m/s²\\. Enter opens it\\.$`));
    // The step goes on to the next case, and back.
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => text(page, 'pareto-announce')).toMatch(new RegExp(`^Case \\d+, 2 of ${front.length} `));
    await page.keyboard.press('ArrowLeft');
    await expect.poll(() => text(page, 'pareto-announce')).toMatch(new RegExp(`^Case ${lightest.caseIndex}, 1 of `));
    // Ringed on the chart, with its number.
    await expect.poll(() => plot.locator('.apexcharts-point-annotations text').filter({ hasText: `Case ${lightest.caseIndex}` }).count()).toBe(1);
    await plot.screenshot({ path: join(SCREENSHOTS, 'pareto-keyboard.png') });
    await screenshot(page, 'sweep-pareto-keyboard');

    await Promise.all([page.waitForURL(new RegExp(`/sweeps/${demo.id}/cases/${lightest.caseIndex}$`)), page.keyboard.press('Enter')]);
    expect(await page.getByTestId('case-title').textContent()).toBe(`Case ${lightest.caseIndex}`);

    // Back on the plot: the ring does not stand in the mouse's way. What lies under its centre is
    // a case's marker (front cases sit a pixel or two apart here, so not necessarily the ringed
    // one), and a click there opens a case.
    await page.goBack();
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    await page.getByTestId('pareto-keys').focus();
    await page.keyboard.press('End');
    await expect.poll(() => text(page, 'pareto-announce')).toMatch(new RegExp(`^Case \\d+, ${front.length} of ${front.length} `));
    const last = (await text(page, 'pareto-announce')).match(/^Case (\d+)/)![1];
    const ring = await plot.locator('.apexcharts-point-annotation-marker.lw-front-current').boundingBox();
    expect(ring).not.toBeNull();
    const [cx, cy] = [ring!.x + ring!.width / 2, ring!.y + ring!.height / 2];
    const under = await page.evaluate(([x, y]) => document.elementFromPoint(x, y)?.getAttribute('class') ?? '', [cx, cy]);
    expect(under).toMatch(/(^|\s)apexcharts-marker(\s|$)/);
    expect(under).not.toContain('lw-front-current');
    await Promise.all([page.waitForURL(/\/cases\/\d+$/), page.mouse.click(cx, cy)]);
    await page.goBack();
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();

    // The chart's zoom buttons answer their own keys (Enter zooms, opens no case), and stepping keeps the zoom.
    const ticks = () => plot.locator('.apexcharts-xaxis-texts-g text').allTextContents();
    const before = (await ticks()).join(' ');
    await page.getByTestId('pareto-keys').focus();
    await page.keyboard.press('ArrowRight');
    await plot.locator('.apexcharts-zoomin-icon').focus();
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await ticks()).join(' ')).not.toBe(before);
    expect(new URL(page.url()).pathname).toBe(`/w/${WS}/sweeps/${demo.id}`);
    const zoomed = (await ticks()).join(' ');
    await page.getByTestId('pareto-keys').focus();
    await page.keyboard.press('End');
    await expect.poll(() => text(page, 'pareto-announce')).toMatch(new RegExp(`^Case ${last}, `));
    expect((await ticks()).join(' ')).toBe(zoomed);

    // Escape clears the selection and the ring.
    await page.keyboard.press('Escape');
    await expect.poll(() => text(page, 'pareto-announce')).toBe('No case selected.');
    await expect.poll(() => plot.locator('.apexcharts-point-annotations text').count()).toBe(0);

    // Another axis, another limit: the lift-off T/W floor, infeasible to its left.
    await page.locator('#ax-x').selectOption({ label: 'Lift-off thrust-to-weight' });
    await expect.poll(() => plot.locator('.apexcharts-xaxis-annotation-label').filter({ hasText: '← infeasible · lift-off T/W minimum 1.25' }).count()).toBe(1);
    expect(await text(page, 'pareto-limits')).toBe(
      'Constraint limits (dashed lines): lift-off T/W minimum 1.25, infeasible to the left; axial acceleration limit 6 g (58.84 m/s²), infeasible above.'
    );
    await page.getByTestId('pareto-keys').focus();
    await page.keyboard.press('Home');
    await expect.poll(() => text(page, 'pareto-announce')).toMatch(/^Case \d+, 1 of \d+ on the front from the left: Lift-off thrust-to-weight [\d.]+; Max axial acceleration /);
    await plot.screenshot({ path: join(SCREENSHOTS, 'pareto-keyboard-tw.png') });

    // The report draws the same limits.
    await page.goto(`/w/${WS}/sweeps/${demo.id}/report`);
    await page.locator('[data-testid="pareto-plot"] .apexcharts-canvas').waitFor();
    await expect.poll(() => text(page, 'pareto-limits')).toContain('GLOW ceiling 45,000 kg');
    await expect.poll(() => page.getByTestId('pareto-plot').locator('.apexcharts-xaxis-annotations line[stroke-dasharray="6"]').count()).toBe(1);
    await page.getByTestId('pareto-plot').screenshot({ path: join(SCREENSHOTS, 'report-pareto-limits.png') });
  });
});
