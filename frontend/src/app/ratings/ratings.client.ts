import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { RatingDetail, RatingRun, RatingSetup, RatingSummary } from '@spanledger/shared';
import { Observable } from 'rxjs';

/**
 * Rating records of spans. A run is rated on the server from the inventory and the span's open
 * findings; every later step sends the version read, and a stale one is answered 409.
 */
@Injectable({ providedIn: 'root' })
export class RatingsClient {
  private readonly http = inject(HttpClient);

  /** The girders, open findings, vehicles and policies a new rating of the span would use. */
  fetchSetup(spanId: number): Observable<RatingSetup> {
    return this.http.get<RatingSetup>(`api/spans/${spanId}/rating-setup`);
  }

  /** Runs and stores a new draft rating of the span. */
  runRating(spanId: number, run: RatingRun): Observable<RatingDetail> {
    return this.http.post<RatingDetail>(`api/spans/${spanId}/ratings`, run);
  }

  /** Runs a draft or returned record again with changed choices. */
  runAgain(ratingId: number, run: RatingRun, version: number): Observable<RatingDetail> {
    return this.http.put<RatingDetail>(`api/ratings/${ratingId}`, { ...run, version });
  }

  fetchRating(ratingId: number): Observable<RatingDetail> {
    return this.http.get<RatingDetail>(`api/ratings/${ratingId}`);
  }

  /** A structure's rating records, newest first. */
  fetchRatingsOfStructure(structureId: number): Observable<RatingSummary[]> {
    return this.http.get<RatingSummary[]>(`api/structures/${structureId}/ratings`);
  }

  /** Submitted records waiting for a reviewer, oldest first. */
  fetchWaitingForReview(): Observable<RatingSummary[]> {
    return this.http.get<RatingSummary[]>('api/ratings/waiting-for-review');
  }

  takeStep(ratingId: number, step: RatingStep, version: number, comment: string): Observable<RatingDetail> {
    return this.http.post<RatingDetail>(`api/ratings/${ratingId}/${step}`, { version, comment });
  }
}

export type RatingStep = 'submit' | 'approve' | 'return';
