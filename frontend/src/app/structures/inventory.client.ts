import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { GirderSummary, SpanChange, SpanDetail, StructureChange, StructureDetail } from '@spanledger/shared';
import { Observable } from 'rxjs';

/** Reads and changes one structure's inventory: the structure, its spans and their girders (values in SI). */
@Injectable({ providedIn: 'root' })
export class InventoryClient {
  private readonly http = inject(HttpClient);

  fetchStructure(structureId: number): Observable<StructureDetail> {
    return this.http.get<StructureDetail>(`api/structures/${structureId}`);
  }

  /** Sends the version read and the changed fields; answers the structure as it now is (409 when the version is stale). */
  changeStructure(structureId: number, change: StructureChange): Observable<StructureDetail> {
    return this.http.patch<StructureDetail>(`api/structures/${structureId}`, change);
  }

  fetchSpans(structureId: number): Observable<SpanDetail[]> {
    return this.http.get<SpanDetail[]>(`api/structures/${structureId}/spans`);
  }

  /** Sends the version read and the changed fields; answers the span as it now is (409 when the version is stale). */
  changeSpan(spanId: number, change: SpanChange): Observable<SpanDetail> {
    return this.http.patch<SpanDetail>(`api/spans/${spanId}`, change);
  }

  /** A span's girders in girder-number order, with their strand counts. */
  fetchGirders(spanId: number): Observable<GirderSummary[]> {
    return this.http.get<GirderSummary[]>(`api/spans/${spanId}/girders`);
  }

  /** The network's district names. */
  fetchDistricts(): Observable<string[]> {
    return this.http.get<string[]>('api/districts');
  }
}
