import { HttpClient, HttpEventType, type HttpEvent, type HttpResponse } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import * as z from 'zod';
import { AssessorLab, AssessorLabDetail, ReportStatus } from '@ringlet/shared/contracts/reports';
import { API } from '../core/api';

/** A download in progress: bytes so far (percent when the size is known) or a background build. */
export type DownloadStep =
  | { kind: 'progress'; percent: number | null; loaded: number }
  | { kind: 'building'; status: ReportStatus }
  | { kind: 'done'; blob: Blob; fileName: string; sha256: string | null };

/** Report files and the assessor's reading room. Responses are parsed here. */
@Injectable({ providedIn: 'root' })
export class ReportsService {
  private readonly http = inject(HttpClient);

  labs(): Observable<AssessorLab[]> {
    return this.http
      .get<unknown>(`${API}/assessor/labs`)
      .pipe(map((b) => z.array(AssessorLab).parse(b)));
  }

  lab(id: string): Observable<AssessorLabDetail> {
    return this.http
      .get<unknown>(`${API}/assessor/labs/${id}/rounds`)
      .pipe(map((b) => AssessorLabDetail.parse(b)));
  }

  status(reportId: string): Observable<ReportStatus> {
    return this.http
      .get<unknown>(`${API}/reports/${reportId}`)
      .pipe(map((b) => ReportStatus.parse(b)));
  }

  /** Fetches a file (path below /api/v1) with download progress; a 202 means a background build. */
  download(path: string): Observable<DownloadStep> {
    return new Observable<DownloadStep>((sub) => {
      const s = this.http
        .get(`${API}${path}`, { responseType: 'blob', observe: 'events', reportProgress: true })
        .subscribe({
          next: (e: HttpEvent<Blob>) => {
            if (e.type === HttpEventType.DownloadProgress) {
              sub.next({
                kind: 'progress',
                loaded: e.loaded,
                percent: e.total ? Math.round((100 * e.loaded) / e.total) : null,
              });
            } else if (e.type === HttpEventType.Response) {
              const res = e as HttpResponse<Blob>;
              if (res.status === 202 && res.body) {
                // The 202 body is the build's status (JSON); one that does not read fails the call.
                res.body
                  .text()
                  .then((text) => {
                    sub.next({ kind: 'building', status: ReportStatus.parse(JSON.parse(text)) });
                    sub.complete();
                  })
                  .catch((err: unknown) => sub.error(err));
                return;
              }
              if (res.body) {
                const cd = res.headers.get('Content-Disposition') ?? '';
                const fileName =
                  /filename="([^"]+)"/.exec(cd)?.[1] ?? path.split('/').pop()!.split('?')[0]!;
                sub.next({
                  kind: 'done',
                  blob: res.body,
                  fileName,
                  sha256: res.headers.get('X-Content-SHA256'),
                });
              }
              sub.complete();
            }
          },
          error: (err: unknown) => sub.error(err),
        });
      return () => s.unsubscribe();
    });
  }
}

/** Hands a downloaded file to the browser. */
export function saveFile(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
