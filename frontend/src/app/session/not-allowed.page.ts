import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

/** Where a page the user's role may not open sends them, with the way to find out why. */
@Component({
  selector: 'sl-not-allowed-page',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  template: `
    <section class="card" role="alert" data-testid="not-allowed">
      <mat-icon class="mark" aria-hidden="true">block</mat-icon>
      <h1>Your role cannot open this page</h1>
      <p>See what your role can do, or ask your organisation to change your role.</p>
      <a mat-flat-button routerLink="/my-role">What my role can do</a>
    </section>
  `,
  styles: `
    :host { flex: 1; display: flex; align-items: center; justify-content: center; padding: 24px; }
    .card { max-width: 440px; padding: 32px; text-align: center; }
    .mark { font-size: 40px; width: 40px; height: 40px; color: var(--mat-sys-error); }
    h1 { font: var(--mat-sys-headline-small); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotAllowedPage {}
