import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { timer, switchMap, takeWhile, last } from 'rxjs';
import type { ReportStatus } from '@ringlet/shared/contracts/reports';
import { BuildState } from './build-state';
import { ReportsService, saveFile } from './reports-service';

/**
 * One file download with its progress: bytes received, or the progress of a background build
 * (polled every second) after which the file is fetched again.
 */
@Component({
  selector: 'app-download-button',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, BuildState],
  template: `
    <span class="dl">
      <button
        mat-stroked-button
        type="button"
        [disabled]="busy()"
        (click)="start()"
        [attr.data-testid]="testId()"
      >
        <mat-icon>download</mat-icon> {{ label() }}
      </button>
      @if (busy()) {
        <mat-progress-bar
          [mode]="percent() === null ? 'indeterminate' : 'determinate'"
          [value]="percent() ?? 0"
          [attr.aria-label]="'Progress of ' + label()"
          data-testid="download-progress"
        />
        <span class="note">{{ note() }}</span>
      }
      @if (build(); as b) {
        <app-build-state [status]="b" />
      }
      @if (error()) {
        <span class="note error" role="alert">{{ error() }}</span>
      }
    </span>
  `,
  styles: `
    .dl {
      display: inline-flex;
      flex-direction: column;
      gap: 4px;
      min-width: 180px;
      margin: 0 8px 8px 0;
    }
    .note {
      font-size: 12px;
      color: var(--mat-sys-on-surface-variant);
    }
    .error {
      color: #a4262c;
    }
  `,
})
export class DownloadButton {
  readonly path = input.required<string>();
  readonly label = input.required<string>();
  readonly testId = input<string>('download');
  private readonly reports = inject(ReportsService);
  private readonly destroy = inject(DestroyRef);
  protected readonly busy = signal(false);
  protected readonly percent = signal<number | null>(null);
  protected readonly note = signal('');
  protected readonly error = signal('');
  /** The background build's state (queued, running with progress, done, failed); null for a direct download. */
  protected readonly build = signal<Pick<ReportStatus, 'status' | 'progress' | 'error'> | null>(
    null,
  );

  protected start(): void {
    this.busy.set(true);
    this.error.set('');
    this.percent.set(null);
    this.note.set('Preparing…');
    if (this.build()?.status !== 'done') this.build.set(null);
    const sub = this.reports.download(this.path()).subscribe({
      next: (step) => {
        if (step.kind === 'progress') {
          this.percent.set(step.percent);
          this.note.set(`${Math.round(step.loaded / 1024)} kB received`);
        } else if (step.kind === 'building') {
          this.build.set(step.status);
          this.poll(step.status.id);
        } else {
          saveFile(step.blob, step.fileName);
          this.busy.set(false);
          this.note.set('');
        }
      },
      error: () => {
        this.busy.set(false);
        this.error.set('The download failed. Try again.');
      },
    });
    this.destroy.onDestroy(() => sub.unsubscribe());
  }

  private poll(reportId: string): void {
    const sub = timer(0, 1000)
      .pipe(
        switchMap(() => this.reports.status(reportId)),
        takeWhile((s) => s.status === 'queued' || s.status === 'running', true),
      )
      .pipe(last())
      .subscribe({
        next: (s) => {
          this.build.set(s);
          if (s.status === 'done') this.start();
          else {
            this.busy.set(false);
            this.error.set(s.error ?? 'The file could not be built.');
          }
        },
        error: () => {
          this.busy.set(false);
          this.error.set('The build could not be followed. Try again.');
        },
      });
    const progress = timer(0, 1000)
      .pipe(
        switchMap(() => this.reports.status(reportId)),
        takeWhile((s) => s.status === 'queued' || s.status === 'running'),
      )
      .subscribe((s) => {
        this.build.set(s);
        this.percent.set(s.progress);
        this.note.set(`Building the file on the server: ${s.progress} %`);
      });
    this.destroy.onDestroy(() => {
      sub.unsubscribe();
      progress.unsubscribe();
    });
  }
}
