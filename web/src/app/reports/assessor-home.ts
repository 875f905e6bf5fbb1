import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import type { AssessorLab } from '@ringlet/shared/contracts/reports';
import { AuthService } from '../core/auth-service';
import { ReportsService } from './reports-service';

/** The assessor's start page: the labs whose active grant lets the assessor read them. */
@Component({
  selector: 'app-assessor-home',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Assessor: labs that granted you access</h1>
      <p>
        Welcome, {{ auth.me()?.name }}. Each lab below has given you read access to its results,
        investigations and instrument checks for a period. Access ends when the grant ends.
      </p>
      @if (loading()) {
        <p>Loading…</p>
      } @else if (labs().length === 0) {
        <p data-testid="no-labs">No lab has an active grant for you at the moment.</p>
      } @else {
        <table class="plain" aria-label="Labs">
          <thead>
            <tr>
              <th>Lab</th>
              <th>Access from</th>
              <th>Access until</th>
            </tr>
          </thead>
          <tbody>
            @for (l of labs(); track l.id) {
              <tr>
                <td>
                  <a [routerLink]="['labs', l.id]" data-testid="lab-link">{{ l.name }}</a>
                </td>
                <td>{{ l.startsOn }}</td>
                <td>{{ l.endsOn ?? 'open-ended' }}</td>
              </tr>
            }
          </tbody>
        </table>
      }
    </section>
  `,
  styleUrl: './reports.scss',
})
export class AssessorHome implements OnInit {
  protected readonly auth = inject(AuthService);
  private readonly reports = inject(ReportsService);
  protected readonly labs = signal<AssessorLab[]>([]);
  protected readonly loading = signal(true);

  ngOnInit(): void {
    this.reports.labs().subscribe({
      next: (l) => {
        this.labs.set(l);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
