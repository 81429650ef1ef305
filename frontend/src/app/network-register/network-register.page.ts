import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RESULT_CAUTION } from '@spanledger/shared';
import { map } from 'rxjs';

import { StructuresClient } from '../network-map/structures.client';

/** The network register for managers: every structure in one table, and the CSV export of it. */
@Component({
  selector: 'sl-network-register-page',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './network-register.page.html',
  styleUrl: './network-register.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NetworkRegisterPage {
  private readonly answer = toSignal(inject(StructuresClient).fetchNetwork().pipe(map((collection) => collection.features.map((feature) => feature.properties))));
  protected readonly structures = computed(() => this.answer() ?? []);
  protected readonly loading = computed(() => this.answer() === undefined);
  protected readonly caution = RESULT_CAUTION;
}
