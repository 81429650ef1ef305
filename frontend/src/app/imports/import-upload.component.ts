import { HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, inject, output, signal, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES, templateOfFileName, type ImportDetail, type ImportTemplateName } from '@spanledger/shared';
import { Subscription } from 'rxjs';

import { ImportsClient } from './imports.client';
import { type UploadFailure, uploadFailureOf } from './imports-text';

/** Where an upload is: bytes on their way (percent sent), or all sent and the server reading the file. */
type UploadProgress = { readonly kind: 'sending'; readonly percent: number } | { readonly kind: 'checking' };

/**
 * Takes a CSV or XLSX file, picked or dropped (and for a CSV the template it holds, read from its
 * name when it names one), uploads it with a progress bar and hands on the server's check of it.
 * Nothing is written to the register by this step.
 */
@Component({
  selector: 'sl-import-upload',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatProgressBarModule, MatSelectModule, RouterLink],
  templateUrl: './import-upload.component.html',
  styleUrl: './import-upload.component.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportUploadComponent {
  /** The server checked the file: its answer, now in the history. */
  readonly checked = output<ImportDetail>();
  /** The user stopped an upload; the server may have kept the check if the file had all arrived. */
  readonly cancelled = output<void>();

  private readonly client = inject(ImportsClient);
  private readonly fileInput = viewChild<ElementRef<HTMLInputElement>>('fileInput');

  protected readonly templates = IMPORT_TEMPLATE_NAMES.map((name) => ({ name, title: IMPORT_TEMPLATES[name].title }));
  protected readonly template = new FormControl<ImportTemplateName | null>(null);
  private readonly chosenTemplate = toSignal(this.template.valueChanges, { initialValue: this.template.value });

  protected readonly chosenFile = signal<File | null>(null);
  protected readonly dragging = signal(false);
  protected readonly progress = signal<UploadProgress | null>(null);
  protected readonly failure = signal<UploadFailure | null>(null);
  private upload: Subscription | null = null;

  protected readonly uploading = computed(() => this.progress() !== null);
  /** The extension only decides whether to ask for a template; the server judges the file by its bytes. */
  protected readonly isCsv = computed(() => /\.csv$/i.test(this.chosenFile()?.name ?? ''));
  protected readonly namedTemplate = computed(() => {
    const file = this.chosenFile();
    return file && this.isCsv() ? templateOfFileName(file.name) : null;
  });
  protected readonly templateHint = computed(() => {
    const named = this.namedTemplate();
    if (named === null) return 'A CSV file holds the rows of one template: choose which.';
    return `The file's name says ${IMPORT_TEMPLATES[named].title.toLowerCase()}; choose another template if its rows follow one.`;
  });
  /** A CSV without a template cannot be read; the server would refuse it too. */
  protected readonly needsTemplate = computed(() => this.isCsv() && this.chosenTemplate() === null);
  protected readonly canSend = computed(() => this.chosenFile() !== null && !this.needsTemplate() && !this.uploading());
  protected readonly chosenText = computed(() => this.chosenFile()?.name ?? 'No file chosen');
  protected readonly progressText = computed(() => {
    const progress = this.progress();
    const name = this.chosenFile()?.name ?? '';
    if (progress === null) return '';
    return progress.kind === 'sending' ? `Uploading ${name}: ${progress.percent} %` : `Checking ${name}: every row against its template and the register…`;
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => this.upload?.unsubscribe());
  }

  protected chooseFile(): void {
    this.fileInput()?.nativeElement.click();
  }

  protected onFileChosen(event: Event): void {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0] ?? null;
    // Cleared so that choosing the same file again, once fixed, counts as a new choice.
    input.value = '';
    if (file) this.take(file);
  }

  protected onDragOver(event: DragEvent): void {
    // Without this the browser opens the dropped file itself.
    event.preventDefault();
    if (!this.uploading()) this.dragging.set(true);
  }

  protected onDragLeave(event: DragEvent): void {
    // Moving over the zone's own button or text leaves the zone's box too; only leaving it counts.
    const zone = event.currentTarget as Node | null;
    if (zone && event.relatedTarget instanceof Node && zone.contains(event.relatedTarget)) return;
    this.dragging.set(false);
  }

  protected onDrop(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file && !this.uploading()) this.take(file);
  }

  protected send(): void {
    const file = this.chosenFile();
    if (!file || !this.canSend()) return;
    this.failure.set(null);
    this.progress.set({ kind: 'sending', percent: 0 });
    this.upload = this.client.uploadFile(file, this.isCsv() ? this.template.value : null).subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) {
          const sentAll = event.total !== undefined && event.loaded >= event.total;
          this.progress.set(sentAll ? { kind: 'checking' } : { kind: 'sending', percent: event.total ? Math.round((100 * event.loaded) / event.total) : 0 });
        } else if (event.type === HttpEventType.Response && event.body) {
          this.clear();
          this.checked.emit(event.body);
        }
      },
      error: (error: unknown) => {
        this.upload = null;
        this.progress.set(null);
        this.failure.set(uploadFailureOf(error));
      },
    });
  }

  protected cancelUpload(): void {
    this.upload?.unsubscribe();
    this.upload = null;
    this.progress.set(null);
    this.cancelled.emit();
  }

  private take(file: File): void {
    this.chosenFile.set(file);
    this.failure.set(null);
    this.template.setValue(this.namedTemplate());
  }

  private clear(): void {
    this.upload = null;
    this.progress.set(null);
    this.chosenFile.set(null);
    this.template.setValue(null);
  }
}
