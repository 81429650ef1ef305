import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterOutlet } from '@angular/router';

/** The shell: the product's top bar above whichever page the router shows. */
@Component({
  selector: 'sl-root',
  imports: [MatToolbarModule, MatIconModule, RouterOutlet],
  template: `
    <mat-toolbar class="top-bar">
      <mat-icon class="product-mark" aria-hidden="true">architecture</mat-icon>
      <span class="product-name">Spanledger</span>
    </mat-toolbar>
    <main class="page">
      <router-outlet />
    </main>
  `,
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {}
