/**
 * The text of an input bound to an SI value (NumberField, ListField): kept as typed while the
 * user types — the field records what it wrote back, so that echo does not reset the text —
 * and refreshed when the value changes from outside (import, clone, catalogue pick) or the
 * unit system switches. Construct it while a component initialises (it owns an $effect).
 */
import { untrack } from 'svelte';
import type { UnitSystem } from '$lib/units';
import { toUnits, type DisplayKind } from './quantities';

/** An SI number in the display unit for an input: 7 significant digits, no grouping (it parses back). */
export function inputNumber(kind: DisplayKind, si: number, system: UnitSystem): string {
  return String(Number(toUnits(kind, si, system).toPrecision(7)));
}

export class BoundText {
  text = $state('');
  #written: unknown;
  #system: UnitSystem;

  constructor(read: () => { value: unknown; system: UnitSystem }, show: (value: unknown, system: UnitSystem) => string) {
    const first = untrack(read);
    this.text = untrack(() => show(first.value, first.system));
    this.#written = first.value;
    this.#system = first.system;
    $effect(() => {
      const { value, system } = read();
      if (value !== this.#written || system !== this.#system) {
        this.text = show(value, system);
        this.#written = value;
        this.#system = system;
      }
    });
  }

  /** The field typed `text` and wrote `value` back. */
  typed(text: string, value: unknown) {
    this.text = text;
    this.#written = value;
  }
}
