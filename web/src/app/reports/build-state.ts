import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ReportStatus } from '@ringlet/shared/contracts/reports';

/** The words a person reads for a background build's state (never the raw value). */
export const BUILD_STATE_LABELS: Record<ReportStatus['status'], string> = {
  queued: 'Waiting to build',
  running: 'Building',
  done: 'Ready',
  failed: 'Failed',
};

const ICONS: Record<ReportStatus['status'], string> = {
  queued: 'schedule',
  running: 'autorenew',
  done: 'check_circle',
  failed: 'error',
};

/**
 * A background report build's state by icon, word and colour, with its progress while it builds:
 * "Waiting to build", "Building 40 %", "Ready", "Failed" (the download button shows the server's message).
 */
@Component({
  selector: 'app-build-state',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    @let s = status();
    <span
      [class]="'state ' + s.status"
      role="status"
      data-testid="build-state"
      [attr.data-state]="s.status"
    >
      <mat-icon aria-hidden="true">{{ icon() }}</mat-icon>
      <span>{{ text() }}</span>
    </span>
  `,
  styles: `
    .state {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-size: 12px;
    }
    .state mat-icon {
      font-size: 16px;
      width: 16px;
      height: 16px;
    }
    .queued,
    .running {
      color: var(--mat-sys-on-surface-variant);
    }
    .done {
      color: #1b6e3a;
    }
    .failed {
      color: #a4262c;
    }
  `,
})
export class BuildState {
  readonly status = input.required<Pick<ReportStatus, 'status' | 'progress' | 'error'>>();
  protected readonly icon = computed(() => ICONS[this.status().status]);
  protected readonly text = computed(() => {
    const s = this.status();
    if (s.status === 'running') return `${BUILD_STATE_LABELS.running} ${s.progress} %`;
    return BUILD_STATE_LABELS[s.status];
  });
}
