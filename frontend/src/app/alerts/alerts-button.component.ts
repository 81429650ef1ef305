import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { NavigationEnd, Router, RouterLink } from '@angular/router';
import type { AlertItem } from '@spanledger/shared';
import { EMPTY, catchError, filter, interval, startWith, switchMap } from 'rxjs';

import { AlertsClient } from './alerts.client';

/** How often the alerts are asked for while the app is open; every navigation asks at once as well. */
export const ALERTS_POLL_MS = 30_000;

const WHEN_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

/**
 * The top bar's alerts: a button with the number unread, opening a list of the newest alerts,
 * each linking to its girder and its inspection; following a link marks the alert read. The
 * shell shows it only while someone is signed in, so it asks for alerts only then.
 */
@Component({
  selector: 'sl-alerts-button',
  imports: [MatButtonModule, MatIconModule, MatMenuModule, RouterLink],
  templateUrl: './alerts-button.component.html',
  styleUrl: './alerts-button.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AlertsButtonComponent {
  private readonly client = inject(AlertsClient);

  protected readonly alerts = signal<readonly AlertItem[]>([]);
  protected readonly unreadCount = computed(() => this.alerts().filter((alert) => alert.readAt === null).length);
  protected readonly buttonLabel = computed(() => {
    const count = this.unreadCount();
    return count === 0 ? 'Alerts, none unread' : `Alerts, ${count} unread`;
  });
  /** More than 99 would not fit the badge. */
  protected readonly badgeText = computed(() => (this.unreadCount() > 99 ? '99+' : String(this.unreadCount())));
  protected readonly items = computed(() =>
    this.alerts().map((alert) => ({
      alert,
      unread: alert.readAt === null,
      when: WHEN_FORMAT.format(new Date(alert.createdAt)),
    })),
  );

  constructor() {
    const navigations = inject(Router).events.pipe(filter((event) => event instanceof NavigationEnd));
    // Each navigation asks at once and starts the 30 s count again, so a busy user is not asked twice in a moment.
    navigations
      .pipe(
        startWith(null),
        switchMap(() => interval(ALERTS_POLL_MS).pipe(startWith(0))),
        switchMap(() => this.client.fetchAlerts().pipe(catchError(() => EMPTY))),
        takeUntilDestroyed(),
      )
      .subscribe((alerts) => this.alerts.set(alerts));
  }

  /** Following either link of an unread alert marks it read; the count drops at once. */
  protected open(alert: AlertItem): void {
    if (alert.readAt !== null) return;
    const readAt = new Date().toISOString();
    this.alerts.update((alerts) => alerts.map((each) => (each.id === alert.id ? { ...each, readAt } : each)));
    this.client.markRead(alert.id).subscribe({
      error: () => this.alerts.update((alerts) => alerts.map((each) => (each.id === alert.id ? { ...each, readAt: null } : each))),
    });
  }
}
