/**
 * The Pareto plot from the keyboard (jsdom; the chart itself is drawn only in the browser
 * suite): one focusable region, arrow keys announce front cases in the user's units, Enter
 * opens the case, Escape clears; constraint limits listed in words beside the plot.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/svelte';
import ParetoPlot, { limitsOf } from '../../src/lib/components/ParetoPlot.svelte';

afterEach(cleanup);

const k = (caseIndex: number, glow: number, payloadMass: number, feasible = true, paretoRank: number | null = null) => ({
  caseIndex,
  feasible,
  paretoRank,
  values: { glow, payloadMass }
});
const front = [k(4, 30_000, 600, true, 1), k(2, 20_000, 400, true, 1), k(9, 25_000, 500, true, 1)];
const cloud = [...front, k(1, 40_000, 300), k(3, 50_000, 100, false)];

function setup(extra: Record<string, unknown> = {}) {
  const onPick = vi.fn();
  render(ParetoPlot, {
    props: { cloud, front, x: 'glow', y: 'payloadMass', directions: { glow: 'min', payloadMass: 'max' }, units: 'si', onPick, ...extra }
  } as never);
  return { onPick, region: screen.getByRole('application', { name: /Pareto plot/ }), live: screen.getByTestId('pareto-announce') };
}

describe('ParetoPlot from the keyboard', () => {
  it('is one tab stop that describes itself and its keys', () => {
    const { region } = setup();
    expect(region.tabIndex).toBe(0);
    expect(region.getAttribute('aria-label')).toBe('Pareto plot: Payload (kg) against Gross lift-off mass (kg), 3 cases on the front');
    const help = document.getElementById(region.getAttribute('aria-describedby')!.split(' ')[0])!;
    expect(help.textContent).toContain('Only the front is stepped through');
    expect(help.textContent).toContain('Enter opens the case');
  });

  it('steps through the front left to right, announces the case, opens it with Enter and clears with Escape', async () => {
    const { region, live, onPick } = setup();
    expect(live.getAttribute('aria-live')).toBe('polite');
    expect(live.textContent).toBe('');
    await fireEvent.keyDown(region, { key: 'ArrowRight' });
    expect(live.textContent).toBe('Case 2, 1 of 3 on the front from the left: Gross lift-off mass 20,000 kg; Payload 400 kg. Enter opens it.');
    await fireEvent.keyDown(region, { key: 'ArrowRight' });
    expect(live.textContent).toContain('Case 9, 2 of 3');
    await fireEvent.keyDown(region, { key: 'End' });
    expect(live.textContent).toContain('Case 4, 3 of 3');
    await fireEvent.keyDown(region, { key: 'Enter' });
    expect(onPick).toHaveBeenCalledWith(4);
    await fireEvent.keyDown(region, { key: 'Escape' });
    expect(live.textContent).toBe('No case selected.');
    // Nothing selected: Enter opens nothing.
    await fireEvent.keyDown(region, { key: 'Enter' });
    expect(onPick).toHaveBeenCalledTimes(1);
  });

  it('keeps the page from scrolling on its own keys only', async () => {
    const { region } = setup();
    const arrow = new KeyboardEvent('keydown', { key: 'ArrowDown', bubbles: true, cancelable: true });
    region.dispatchEvent(arrow);
    expect(arrow.defaultPrevented).toBe(true);
    const tab = new KeyboardEvent('keydown', { key: 'Tab', bubbles: true, cancelable: true });
    region.dispatchEvent(tab);
    expect(tab.defaultPrevented).toBe(false);
  });

  it('leaves keys pressed on a control inside the plot (the chart toolbar) to that control', async () => {
    const { region, live, onPick } = setup();
    await fireEvent.keyDown(region, { key: 'ArrowRight' });
    const inner = region.firstElementChild!;
    for (const key of ['Enter', 'ArrowRight', 'Escape']) {
      const ev = new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true });
      inner.dispatchEvent(ev);
      expect(ev.defaultPrevented, key).toBe(false);
    }
    expect(onPick).not.toHaveBeenCalled();
    expect(live.textContent).toContain('Case 2, 1 of 3');
  });

  it('announces in US units, and without a way to open a case says nothing of Enter', async () => {
    const { region, live } = setup({ units: 'us', onPick: undefined });
    await fireEvent.keyDown(region, { key: 'ArrowLeft' });
    // 30 000 kg / 0.45359237 kg/lb = 66 138.7 lb; 600 kg = 1 322.8 lb (NIST SP 811 App. B.9).
    expect(live.textContent).toBe('Case 4, 3 of 3 on the front from the left: Gross lift-off mass 66,139 lb; Payload 1,323 lb.');
    expect(document.body.textContent).not.toContain('Enter opens');
  });

  it('lists the constraint limits of the plotted axes in words, with the infeasible side', () => {
    setup({ limits: limitsOf({ glowCeiling: 35_000, payloadFloor: 350, maxDynamicPressure: 45_000 }) });
    expect(screen.getByTestId('pareto-limits').textContent).toBe(
      'Constraint limits (dashed lines): GLOW ceiling 35,000 kg, infeasible to the right; payload floor 350 kg, infeasible below.'
    );
  });

  it('lists a limit far past every plotted case as off the plot', () => {
    setup({ limits: limitsOf({ glowCeiling: 500_000 }) });
    expect(screen.getByTestId('pareto-limits').textContent).toBe(
      'Constraint limits (dashed lines): GLOW ceiling 500,000 kg, off the plot, every plotted case on its feasible side.'
    );
  });
});
