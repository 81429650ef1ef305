import { Injectable, computed, signal } from '@angular/core';

import { MeasureKind, UNIT_SYSTEMS, UnitSystem, formatMeasure, unitLabels } from './measures';

/** Where the browser remembers the user's choice between visits. */
export const UNIT_SYSTEM_STORAGE_KEY = 'spanledger.units';

/** The unit system every page shows and takes values in, remembered in this browser. */
@Injectable({ providedIn: 'root' })
export class UnitsStore {
  private readonly current = signal<UnitSystem>(rememberedSystem());

  readonly system = this.current.asReadonly();
  /** The unit label of every kind of value in the current system, e.g. `labels().spanLength` is 'm' or 'ft'. */
  readonly labels = computed(() => unitLabels(this.current()));

  use(system: UnitSystem): void {
    this.current.set(system);
    try {
      localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, system);
    } catch {
      // Storage may be off (private windows, policies): the choice then lasts until the page reloads.
    }
  }

  /** A stored (SI) value in the current system; read inside a `computed` so it follows the switch. */
  format(kind: MeasureKind, storedValue: number | null, options: { withUnit?: boolean } = {}): string {
    return formatMeasure(kind, storedValue, this.current(), options);
  }
}

function rememberedSystem(): UnitSystem {
  try {
    const stored = localStorage.getItem(UNIT_SYSTEM_STORAGE_KEY);
    return UNIT_SYSTEMS.find((system) => system === stored) ?? 'si';
  } catch {
    return 'si';
  }
}
