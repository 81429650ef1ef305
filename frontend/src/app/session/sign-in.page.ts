import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute } from '@angular/router';
import { map } from 'rxjs';

import { signInUrl } from './session.store';

/** What a visitor sees instead of the data: one way in, through the organisation's sign-in. */
@Component({
  selector: 'sl-sign-in-page',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <section class="card" aria-labelledby="sign-in-title">
      <mat-icon class="mark" aria-hidden="true">lock</mat-icon>
      <h1 id="sign-in-title">Sign in to Spanledger</h1>
      <p>Spanledger holds your organisation's bridge register, inspections and load ratings. Sign in with your organisation's account to see them.</p>
      <a mat-flat-button data-testid="sign-in" [href]="signInHref()">Sign in with your organisation</a>
    </section>
  `,
  styles: `
    :host { flex: 1; display: flex; align-items: center; justify-content: center; padding: 24px; background: var(--mat-sys-surface-container); }
    .card { max-width: 440px; padding: 32px; border-radius: 16px; background: var(--mat-sys-surface); box-shadow: var(--mat-sys-level1); text-align: center; }
    .mark { font-size: 40px; width: 40px; height: 40px; color: var(--mat-sys-primary); }
    h1 { font: var(--mat-sys-headline-small); margin: 8px 0; }
    p { font: var(--mat-sys-body-large); color: var(--mat-sys-on-surface-variant); margin: 0 0 24px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignInPage {
  private readonly returnTo = toSignal(inject(ActivatedRoute).queryParamMap.pipe(map((params) => params.get('returnTo') ?? '/')), { initialValue: '/' });
  protected readonly signInHref = computed(() => signInUrl(this.returnTo()));
}
