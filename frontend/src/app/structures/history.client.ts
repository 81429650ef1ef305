import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { HistoryEvent, Page } from '@spanledger/shared';
import { Observable } from 'rxjs';

/** Reads a structure's history: its own changes and those of its spans and girders, newest first. */
@Injectable({ providedIn: 'root' })
export class HistoryClient {
  private readonly http = inject(HttpClient);

  fetchStructureHistory(structureId: number, page: { readonly limit: number; readonly offset: number }): Observable<Page<HistoryEvent>> {
    const params = new HttpParams().set('limit', page.limit).set('offset', page.offset);
    return this.http.get<Page<HistoryEvent>>(`api/structures/${structureId}/history`, { params });
  }
}
