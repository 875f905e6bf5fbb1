import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { Router } from '@angular/router';
import { AuthService } from './auth-service';

/**
 * For a person in several labs: the lab they act for. The choice lives in the server's session
 * (PUT /auth/acting-lab), so the Lab bench, Track record, board and reports all act for it; the
 * page on screen is opened again for the new lab. Hidden for everyone in one lab or none.
 */
@Component({
  selector: 'app-lab-chooser',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (labs().length > 1) {
      <label class="lab-chooser" [class.unchosen]="!acting()">
        <span class="label">Acting for</span>
        <select
          data-testid="lab-chooser"
          [value]="acting() ?? ''"
          (change)="choose($event)"
          [disabled]="busy()"
        >
          @if (!acting()) {
            <option value="" disabled>Choose a lab…</option>
          }
          @for (m of labs(); track m.organisationId) {
            <option [value]="m.organisationId" [selected]="m.organisationId === acting()">
              {{ m.organisationName }}
            </option>
          }
        </select>
      </label>
      <span class="visually-hidden" role="status">{{ announced() }}</span>
    }
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
    }
    .lab-chooser {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      font-size: 14px;
    }
    .label {
      white-space: nowrap;
    }
    select {
      font: inherit;
      max-width: 220px;
      padding: 4px 6px;
      border-radius: 4px;
      border: 1px solid #8a96a3;
      background: #fff;
      color: #1d2733;
    }
    .unchosen select {
      border-color: #b7791f;
      outline: 2px solid #b7791f;
    }
    .visually-hidden {
      position: absolute;
      width: 1px;
      height: 1px;
      overflow: hidden;
      clip: rect(0 0 0 0);
      white-space: nowrap;
    }
  `,
})
export class LabChooser {
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);
  protected readonly labs = computed(() => this.auth.me()?.memberships ?? []);
  protected readonly acting = this.auth.actingLabId;
  protected readonly busy = signal(false);
  protected readonly announced = signal('');

  protected choose(event: Event): void {
    const labId = (event.target as HTMLSelectElement).value;
    if (!labId || labId === this.acting()) return;
    this.busy.set(true);
    this.auth.chooseLab(labId).subscribe({
      next: () => {
        this.busy.set(false);
        const name = this.labs().find((m) => m.organisationId === labId)?.organisationName ?? '';
        this.announced.set(`Now acting for ${name}.`);
        void this.reopen();
      },
      error: () => this.busy.set(false),
    });
  }

  /** Opens the current page again for the new lab (a round page of the old lab goes to the bench). */
  private async reopen(): Promise<void> {
    const url = this.router.url;
    if (url.startsWith('/bench/rounds/')) {
      await this.router.navigateByUrl('/bench');
      return;
    }
    await this.router.navigateByUrl('/no-role', { skipLocationChange: true });
    await this.router.navigateByUrl(url);
  }
}
