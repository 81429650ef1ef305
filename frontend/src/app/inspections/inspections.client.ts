import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { FindingChange, FindingDetail, InspectionChange, InspectionDetail, InspectionSummary, NewFinding, NewInspection } from '@spanledger/shared';
import { Observable } from 'rxjs';

/**
 * Field inspections and their findings (values in SI, positions along a span in m). Every change
 * sends the version read; a stale one is answered 409 and nothing is written.
 */
@Injectable({ providedIn: 'root' })
export class InspectionsClient {
  private readonly http = inject(HttpClient);

  /** A structure's inspections, newest first. */
  fetchInspectionsOfStructure(structureId: number): Observable<InspectionSummary[]> {
    return this.http.get<InspectionSummary[]>(`api/structures/${structureId}/inspections`);
  }

  /** Starts a draft; the structure's open findings come carried forward in it, to be reviewed. */
  startInspection(structureId: number, inspection: NewInspection): Observable<InspectionDetail> {
    return this.http.post<InspectionDetail>(`api/structures/${structureId}/inspections`, inspection);
  }

  fetchInspection(inspectionId: number): Observable<InspectionDetail> {
    return this.http.get<InspectionDetail>(`api/inspections/${inspectionId}`);
  }

  /** The author's change of date, kind, condition ratings or notes, while a draft or returned. */
  changeInspection(inspectionId: number, change: InspectionChange): Observable<InspectionDetail> {
    return this.http.patch<InspectionDetail>(`api/inspections/${inspectionId}`, change);
  }

  /** Refused (400 naming `findings.<index>.disposition`) while a carried-forward finding is still to review. */
  submitInspection(inspectionId: number, version: number): Observable<InspectionDetail> {
    return this.http.post<InspectionDetail>(`api/inspections/${inspectionId}/submit`, { version });
  }

  acceptInspection(inspectionId: number, version: number): Observable<InspectionDetail> {
    return this.http.post<InspectionDetail>(`api/inspections/${inspectionId}/accept`, { version });
  }

  /** Sends a submitted inspection back to its author with what needs changing. */
  returnInspection(inspectionId: number, version: number, comment: string): Observable<InspectionDetail> {
    return this.http.post<InspectionDetail>(`api/inspections/${inspectionId}/return`, { version, comment });
  }

  addFinding(inspectionId: number, finding: NewFinding): Observable<FindingDetail> {
    return this.http.post<FindingDetail>(`api/inspections/${inspectionId}/findings`, finding);
  }

  /** The whole finding with the version read; a carried-forward one also takes its disposition. */
  changeFinding(findingId: number, change: FindingChange): Observable<FindingDetail> {
    return this.http.put<FindingDetail>(`api/findings/${findingId}`, change);
  }

  /** Only a finding new in this inspection can be deleted. */
  deleteFinding(findingId: number): Observable<void> {
    return this.http.delete<void>(`api/findings/${findingId}`);
  }
}
