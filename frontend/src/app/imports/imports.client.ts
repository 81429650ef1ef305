import { HttpClient, HttpContext, HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ImportDetail, ImportSummary, ImportTemplateName, importStep } from '@spanledger/shared';
import { Observable } from 'rxjs';
import type { z } from 'zod';

import { QUIET_ON_FAILURE } from '../server-errors/server-error.interceptor';

/** Spreadsheet imports: the check of an upload, the history, and the steps that write or set aside a checked file. */
@Injectable({ providedIn: 'root' })
export class ImportsClient {
  private readonly http = inject(HttpClient);

  /**
   * Uploads one CSV or XLSX file as multipart field `file`, with the template a CSV holds; the
   * events report the bytes sent, for a progress bar, and end with the server's check of the file.
   */
  uploadFile(file: File, template: ImportTemplateName | null): Observable<HttpEvent<ImportDetail>> {
    const body = new FormData();
    // Text fields before the file, as the server reads the form in order.
    if (template !== null) body.append('template', template);
    body.append('file', file, file.name);
    return this.http.post<ImportDetail>('api/imports', body, { reportProgress: true, observe: 'events' });
  }

  /** The import history, newest first. */
  fetchHistory(): Observable<ImportSummary[]> {
    return this.http.get<ImportSummary[]>('api/imports');
  }

  /**
   * One import with its first problems. `quiet` is for the app's own polling while a commit runs:
   * a failed poll is asked again a second later rather than popping a message each time.
   */
  fetchImport(importId: number, options: { quiet?: boolean } = {}): Observable<ImportDetail> {
    return this.http.get<ImportDetail>(`api/imports/${importId}`, { context: new HttpContext().set(QUIET_ON_FAILURE, options.quiet ?? false) });
  }

  /**
   * Writes a clean check. A small file answers 200 once it is `committed` (or `failed`); a large
   * one answers 202 `committing`, written by a background job and followed with `fetchImport`.
   */
  commitImport(importId: number, version: number): Observable<ImportDetail> {
    return this.http.post<ImportDetail>(`api/imports/${importId}/commit`, stepBody(version));
  }

  /** Sets a checked import aside; nothing is written. */
  discardImport(importId: number, version: number): Observable<ImportDetail> {
    return this.http.post<ImportDetail>(`api/imports/${importId}/discard`, stepBody(version));
  }
}

/** The body both steps send, as the server's schema reads it: the version read. */
const stepBody = (version: number): z.input<typeof importStep> => ({ version });

/** An empty template with its example row, for downloading. */
export function templateDownloadUrl(template: ImportTemplateName, format: 'csv' | 'xlsx'): string {
  return `api/import-templates/${template}.${format}`;
}

/** Every template in one workbook, a sheet each, with one sheet describing their columns. */
export const TEMPLATE_WORKBOOK_URL = 'api/import-templates/all.xlsx';

/** Every problem of an import, a line each, for downloading. */
export function problemsReportUrl(importId: number): string {
  return `api/imports/${importId}/problems.csv`;
}
