import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ClientConfig } from '@spanledger/shared';
import { Observable } from 'rxjs';

export type { ClientConfig };

/** Settings a deployment gives the browser: `GET /api/client-config`. */
@Injectable({ providedIn: 'root' })
export class ClientConfigClient {
  private readonly http = inject(HttpClient);

  load(): Observable<ClientConfig> {
    return this.http.get<ClientConfig>('api/client-config');
  }
}
