import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AlertItem } from '@spanledger/shared';
import { Observable } from 'rxjs';

import { QUIET_ON_FAILURE } from '../server-errors/server-error.interceptor';

/** The signed-in user's alerts, such as a critical finding in one of their districts. */
@Injectable({ providedIn: 'root' })
export class AlertsClient {
  private readonly http = inject(HttpClient);

  /** The newest 50, newest first. */
  fetchAlerts(): Observable<AlertItem[]> {
    // Polled in the background: a server that is briefly away should not pop a message every 30 s.
    return this.http.get<AlertItem[]>('api/alerts', { context: new HttpContext().set(QUIET_ON_FAILURE, true) });
  }

  markRead(alertId: number): Observable<void> {
    return this.http.post<void>(`api/alerts/${alertId}/read`, null);
  }
}
