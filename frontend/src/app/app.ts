import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatToolbarModule } from '@angular/material/toolbar';
import { IsActiveMatchOptions, Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { ROLE_NAMES, changeScope, templatesUserMayImport } from '@spanledger/shared';

import { AlertsButtonComponent } from './alerts/alerts-button.component';
import { SessionStore } from './session/session.store';
import { UnitsSwitchComponent } from './units/units-switch.component';

/** The shell: the product's top bar, with the signed-in user and the pages their role opens, above the page. */
@Component({
  selector: 'sl-root',
  imports: [MatToolbarModule, MatIconModule, MatButtonModule, RouterOutlet, RouterLink, RouterLinkActive, UnitsSwitchComponent, AlertsButtonComponent],
  template: `
    <mat-toolbar class="top-bar">
      <mat-icon class="product-mark" aria-hidden="true">architecture</mat-icon>
      <span class="product-name">Spanledger</span>
      @if (user(); as me) {
        <nav class="pages" aria-label="Pages">
          <a mat-button routerLink="/" routerLinkActive="active" [routerLinkActiveOptions]="mapLinkActive">Network map</a>
          @if (session.can('exportRegister')) {
            <a mat-button routerLink="/register" routerLinkActive="active" data-testid="nav-register">Network register</a>
          }
          @if (session.can('approveRatings')) {
            <a mat-button routerLink="/reviews" routerLinkActive="active" data-testid="nav-reviews">Ratings to review</a>
          }
          @if (mayImport()) {
            <a mat-button routerLink="/imports" routerLinkActive="active" data-testid="nav-imports">Imports</a>
          }
          <a mat-button routerLink="/my-role" routerLinkActive="active">What my role can do</a>
        </nav>
        <span class="spacer"></span>
        <!-- Loaded once the first page is up, keeping the alerts' menu out of the first download. -->
        @defer (on idle) {
          <sl-alerts-button />
        }
        <sl-units-switch />
        <div class="who" data-testid="signed-in-user">
          <span class="name" data-testid="user-name">{{ me.displayName }}</span>
          <span class="role" data-testid="user-role">{{ roleName() }} · {{ districtsText() }}</span>
        </div>
        <button mat-stroked-button class="sign-out" type="button" data-testid="sign-out" (click)="signOut()">Sign out</button>
      }
    </mat-toolbar>
    <main class="page">
      <router-outlet />
    </main>
  `,
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  protected readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  protected readonly user = this.session.user;
  /** The map's filters live in its query string; the link is active whatever they are. */
  protected readonly mapLinkActive: IsActiveMatchOptions = { paths: 'exact', queryParams: 'ignored', matrixParams: 'ignored', fragment: 'ignored' };
  /** Inspectors import findings, raters and managers the inventory: the link is for whoever may import some template. */
  protected readonly mayImport = computed(() => templatesUserMayImport(this.user()).length > 0);
  protected readonly roleName = computed(() => {
    const user = this.user();
    return user ? `${ROLE_NAMES[user.role]}${user.admin ? ' (administrator)' : ''}` : '';
  });
  protected readonly districtsText = computed(() => {
    const user = this.user();
    if (!user) return '';
    const scope = changeScope(user);
    if (scope.kind === 'network') return 'Whole network';
    return scope.kind === 'districts' ? scope.districts.join(', ') : 'No district';
  });

  protected async signOut(): Promise<void> {
    // Leave the signed-in page first: its requests still on the way are cancelled, not refused once the session has ended.
    await this.router.navigate(['/sign-in']);
    await this.session.signOut();
  }
}
