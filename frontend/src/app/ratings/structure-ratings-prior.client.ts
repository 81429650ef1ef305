import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { PriorRatingSummary } from '@spanledger/shared';
import { Observable } from 'rxjs';

/** Ratings on file from before Spanledger; they arrive by import, so the app only reads them. */
@Injectable({ providedIn: 'root' })
export class PriorRatingsClient {
  private readonly http = inject(HttpClient);

  /** A structure's prior ratings, newest first, each with the one it follows. */
  fetchPriorRatings(structureId: number): Observable<PriorRatingSummary[]> {
    return this.http.get<PriorRatingSummary[]>(`api/structures/${structureId}/prior-ratings`);
  }
}
