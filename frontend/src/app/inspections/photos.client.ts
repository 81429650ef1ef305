import { HttpClient, HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { PhotoSummary } from '@spanledger/shared';
import { Observable } from 'rxjs';

/** Photos of an inspection and of its findings. */
@Injectable({ providedIn: 'root' })
export class PhotosClient {
  private readonly http = inject(HttpClient);

  /** Every photo of the inspection, its findings' included (each names its `findingId`). */
  fetchPhotos(inspectionId: number): Observable<PhotoSummary[]> {
    return this.http.get<PhotoSummary[]>(`api/inspections/${inspectionId}/photos`);
  }

  /**
   * Uploads one photo as multipart field `photo`, with the finding it shows when there is one;
   * the events report the bytes sent, for a progress bar, and end with the stored photo.
   */
  uploadPhoto(inspectionId: number, photo: File, findingId: number | null): Observable<HttpEvent<PhotoSummary>> {
    const body = new FormData();
    // Text fields go before the file so that the server knows the finding when the file arrives.
    if (findingId !== null) body.append('findingId', String(findingId));
    body.append('photo', photo, photo.name);
    return this.http.post<PhotoSummary>(`api/inspections/${inspectionId}/photos`, body, { reportProgress: true, observe: 'events' });
  }

  deletePhoto(photoId: number): Observable<void> {
    return this.http.delete<void>(`api/photos/${photoId}`);
  }
}

/** The photo itself, for opening full size. */
export function photoUrl(photoId: number): string {
  return `api/photos/${photoId}`;
}

/** A JPEG of at most 320 px, for lists. */
export function thumbnailUrl(photoId: number): string {
  return `api/photos/${photoId}/thumbnail`;
}
