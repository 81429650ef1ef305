import { HttpErrorResponse, HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, inject, input, output, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { PhotoSummary } from '@spanledger/shared';
import { Subscription } from 'rxjs';

import { describeServerError, serverErrorReport } from '../server-errors/server-error';
import { PhotosClient, photoUrl, thumbnailUrl } from './photos.client';

/**
 * The photos of an inspection, or of one of its findings: thumbnails that open the full photo,
 * and for the author a button that takes a photo with the tablet's camera (or picks a file)
 * and uploads it with a progress bar.
 */
@Component({
  selector: 'sl-inspection-photos',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './photos.component.html',
  styleUrl: './photos.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotosComponent {
  readonly inspectionId = input.required<number>();
  /** The finding the photos show, or null for photos of the inspection as a whole. */
  readonly findingId = input<number | null>(null);
  readonly photos = input.required<readonly PhotoSummary[]>();
  readonly editable = input(false);
  /** A photo was added or deleted: the page reads the photos again. */
  readonly changed = output<void>();

  private readonly client = inject(PhotosClient);
  private readonly fileInput = viewChild<ElementRef<HTMLInputElement>>('fileInput');

  /** Percent sent, or null when no upload is running. */
  protected readonly progress = signal<number | null>(null);
  protected readonly uploadingName = signal('');
  protected readonly failure = signal<string | null>(null);
  protected readonly deletingId = signal<number | null>(null);
  private upload: Subscription | null = null;

  protected readonly thumbnails = computed(() =>
    this.photos().map((photo) => ({ id: photo.id, thumbnail: thumbnailUrl(photo.id), full: photoUrl(photo.id), alt: `Photo ${photo.originalName}` })),
  );
  protected readonly progressText = computed(() => `Uploading ${this.uploadingName()}: ${this.progress() ?? 0} %`);

  constructor() {
    inject(DestroyRef).onDestroy(() => this.upload?.unsubscribe());
  }

  protected choosePhoto(): void {
    this.fileInput()?.nativeElement.click();
  }

  protected onFileChosen(event: Event): void {
    const input = event.target as HTMLInputElement;
    const photo = input.files?.[0];
    // Cleared so that choosing the same file again uploads it again.
    input.value = '';
    if (photo) this.send(photo);
  }

  protected cancelUpload(): void {
    this.upload?.unsubscribe();
    this.upload = null;
    this.progress.set(null);
  }

  protected deletePhoto(photoId: number): void {
    this.failure.set(null);
    this.deletingId.set(photoId);
    this.client.deletePhoto(photoId).subscribe({
      next: () => {
        this.deletingId.set(null);
        this.changed.emit();
      },
      error: (error: unknown) => {
        this.deletingId.set(null);
        this.failure.set(`The photo was not deleted. ${failureText(error)}`);
      },
    });
  }

  private send(photo: File): void {
    this.failure.set(null);
    this.uploadingName.set(photo.name);
    this.progress.set(0);
    this.upload = this.client.uploadPhoto(this.inspectionId(), photo, this.findingId()).subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) {
          this.progress.set(event.total ? Math.round((100 * event.loaded) / event.total) : 0);
        } else if (event.type === HttpEventType.Response) {
          this.progress.set(null);
          this.changed.emit();
        }
      },
      error: (error: unknown) => {
        this.progress.set(null);
        this.failure.set(uploadFailureText(error));
      },
    });
  }
}

/** What went wrong with an upload, said plainly: too large (413) and not a photo (415) above all. */
function uploadFailureText(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) return `The photo was not uploaded. ${String(error)}`;
  const serverSaid = hasServerMessage(error) ? ` ${describeServerError(serverErrorReport(error))}` : '';
  if (error.status === 413) return `The photo is too large to upload.${serverSaid || ' Choose a smaller file, or take the photo again at a lower resolution.'}`;
  if (error.status === 415) return `That file is not a photo the server accepts: upload a JPEG, PNG or WebP image.${serverSaid}`;
  return `The photo was not uploaded. ${failureText(error)}`;
}

function hasServerMessage(error: HttpErrorResponse): boolean {
  const body = error.error as { error?: { message?: unknown } } | null;
  return typeof body?.error?.message === 'string';
}

function failureText(error: unknown): string {
  return error instanceof HttpErrorResponse ? describeServerError(serverErrorReport(error)) : String(error);
}
