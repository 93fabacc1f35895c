/**
 * Unit-aware form fields: they show SI values in the user's system and write SI back,
 * and pass text that is not a number through so the shared schema names the field.
 * Conversion factor: 1 lb = 0.45359237 kg exactly (NIST SP 811, App. B.8).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/svelte';

afterEach(cleanup);
import { flushSync } from 'svelte';
import NumberField from '../../src/lib/components/NumberField.svelte';
import ListField from '../../src/lib/components/ListField.svelte';
import Caution from '../../src/lib/components/Caution.svelte';

describe('NumberField', () => {
  it('shows kilograms as pounds for a US-customary user and writes kilograms back', async () => {
    let value: unknown = 453.59237;
    render(NumberField, {
      props: {
        id: 'm',
        label: 'Payload',
        kind: 'mass',
        system: 'us',
        get value() {
          return value;
        },
        set value(v: unknown) {
          value = v;
        }
      }
    } as never);
    const input = screen.getByLabelText(/Payload/) as HTMLInputElement;
    expect(input.value).toBe('1000');
    expect(screen.getByText('(lb)')).toBeTruthy();
    await fireEvent.input(input, { target: { value: '2000' } });
    flushSync();
    expect(value).toBeCloseTo(907.18474, 9);
    await fireEvent.input(input, { target: { value: '2,0x' } });
    expect(value).toBe('2,0x');
    await fireEvent.input(input, { target: { value: '' } });
    expect(value).toBeUndefined();
  });

  it('keeps the text as typed, and shows a value set from outside or a unit switch anew', async () => {
    const { rerender } = render(NumberField, { props: { id: 'g', label: 'GLOW ceiling', kind: 'mass', system: 'si', value: 1000 } });
    const input = screen.getByLabelText(/GLOW ceiling/) as HTMLInputElement;
    expect(input.value).toBe('1000');
    await fireEvent.input(input, { target: { value: '2,5' } });
    expect(input.value).toBe('2,5');
    // An import or a clone replaces the value: the text follows it.
    await rerender({ value: 45_359.237 });
    expect(input.value).toBe('45359.24');
    // A switch to US customary shows the same mass in pounds (45,359.237 kg = 100,000 lb).
    await rerender({ system: 'us' });
    expect(input.value).toBe('100000');
  });

  it('links its error to the input for assistive technology', () => {
    render(NumberField, { props: { id: 'a', label: 'Inclination', kind: 'angle', system: 'si', value: 200, error: 'inclination must be at most 180 deg' } } as never);
    const input = screen.getByLabelText(/Inclination/);
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(input.getAttribute('aria-describedby')).toBe('a-error');
    expect(document.getElementById('a-error')?.textContent).toBe('inclination must be at most 180 deg');
  });
});

describe('ListField', () => {
  it('reads a list typed in kilometres as metres, keeping a bad token as text', async () => {
    let values: unknown[] = [400_000, 500_000];
    render(ListField, {
      props: {
        id: 'l',
        label: 'Values',
        kind: 'altitude',
        system: 'si',
        get values() {
          return values;
        },
        set values(v: unknown[]) {
          values = v;
        }
      }
    } as never);
    const input = screen.getByLabelText(/Values/) as HTMLInputElement;
    expect(input.value).toBe('400, 500');
    await fireEvent.input(input, { target: { value: '300, 450 abc' } });
    expect(values).toEqual([300_000, 450_000, 'abc']);
  });
});

describe('Caution', () => {
  it('says the figures are conceptual and who decides on flight, range safety and licensing', () => {
    render(Caution);
    const note = screen.getByRole('note', { name: 'Caution' });
    const text = note.textContent!.replace(/\s+/g, ' ');
    expect(text).toContain('Conceptual estimates.');
    expect(text).toContain('Flight, range-safety and licensing decisions belong to qualified engineers and the applicable authorities.');
  });
});
