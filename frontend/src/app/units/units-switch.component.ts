import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

import { UnitSystem } from './measures';
import { UnitsStore } from './units.store';

interface UnitsOption {
  readonly system: UnitSystem;
  readonly label: string;
  readonly title: string;
}

const OPTIONS: readonly UnitsOption[] = [
  { system: 'si', label: 'SI', title: 'SI units (m, mm, kN, MPa)' },
  { system: 'us', label: 'US', title: 'US customary units (ft, in, kip, ksi)' },
];

/**
 * The top bar's choice between SI and US customary units, for every value shown or typed. Two
 * pressed/unpressed buttons from the shell's own button module keep the first download small.
 */
@Component({
  selector: 'sl-units-switch',
  imports: [MatButtonModule],
  template: `
    <div class="units-switch" role="group" aria-label="Units" data-testid="units-switch">
      @for (option of options; track option.system) {
        <button
          mat-button
          type="button"
          [class.chosen]="units.system() === option.system"
          [attr.aria-pressed]="units.system() === option.system"
          [attr.data-testid]="'units-' + option.system"
          [title]="option.title"
          (click)="units.use(option.system)"
        >
          {{ option.label }}
        </button>
      }
    </div>
  `,
  styles: `
    /* It sits on the primary-coloured top bar: outline and text in the bar's own colours. */
    .units-switch {
      display: inline-flex;
      border: 1px solid var(--mat-sys-on-primary);
      border-radius: 18px;
      overflow: hidden;
    }
    /* The toolbar recolours the buttons inside it; these selectors are the more specific. */
    .units-switch .mat-mdc-button {
      --mat-button-text-state-layer-color: var(--mat-sys-on-primary);
      color: var(--mat-sys-on-primary);
      border-radius: 0;
      min-width: 40px;
      height: 34px;
      padding: 0 10px;
    }
    .units-switch .mat-mdc-button.chosen {
      --mat-button-text-state-layer-color: var(--mat-sys-primary);
      color: var(--mat-sys-primary);
      background: var(--mat-sys-on-primary);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitsSwitchComponent {
  protected readonly units = inject(UnitsStore);
  protected readonly options = OPTIONS;
}
