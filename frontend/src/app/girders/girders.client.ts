import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { FindingDetail, GirderChange, GirderDetail, GirderTypeSummary, SpanDetail } from '@spanledger/shared';
import { Observable } from 'rxjs';

/** Reads and changes one girder, with what its editor shows beside it: the catalogue, its span and its findings (values in SI). */
@Injectable({ providedIn: 'root' })
export class GirdersClient {
  private readonly http = inject(HttpClient);

  fetchGirder(girderId: number): Observable<GirderDetail> {
    return this.http.get<GirderDetail>(`api/girders/${girderId}`);
  }

  /** Replaces the whole record with the version read; answers the girder as it now is (409 when the version is stale). */
  changeGirder(girderId: number, change: GirderChange): Observable<GirderDetail> {
    return this.http.put<GirderDetail>(`api/girders/${girderId}`, change);
  }

  /** The catalogue of girder shapes. */
  fetchGirderTypes(): Observable<GirderTypeSummary[]> {
    return this.http.get<GirderTypeSummary[]>('api/girder-types');
  }

  fetchSpan(spanId: number): Observable<SpanDetail> {
    return this.http.get<SpanDetail>(`api/spans/${spanId}`);
  }

  /** The girder's damage register over time, newest first. */
  fetchFindings(girderId: number): Observable<FindingDetail[]> {
    return this.http.get<FindingDetail[]>(`api/girders/${girderId}/findings`);
  }
}
