import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  LOGO_MAX_BYTES,
  ProviderProfileInput,
  type ProviderProfile,
} from '@ringlet/shared/contracts/provider';
import { API } from '../core/api';
import { FileDrop } from '../core/file-drop';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { applyServerIssues, applyZodIssues, errorMessage } from '../core/zod-form-errors';
import { ProviderService } from './provider-service';

type FieldKey = keyof ProviderProfileInput;

/** The fields of the profile with their labels and hints, in the order the form shows them. */
const FIELDS: { key: FieldKey; label: string; hint?: string; multiline?: boolean }[] = [
  {
    key: 'name',
    label: 'Provider name',
    hint: 'Printed on every report and certificate, and the sender name of every e-mail.',
  },
  { key: 'address', label: 'Postal address', hint: 'One line per address line.', multiline: true },
  { key: 'contactEmail', label: 'Contact e-mail' },
  { key: 'contactPhone', label: 'Contact telephone' },
  { key: 'website', label: 'Website', hint: 'Starting with https://' },
  {
    key: 'accreditationBody',
    label: 'Accreditation body',
    hint: 'Leave empty when the provider is not accredited.',
  },
  { key: 'accreditationNumber', label: 'Accreditation number (ISO/IEC 17043)' },
  { key: 'authoriserName', label: 'Person who authorises reports' },
  {
    key: 'authoriserRole',
    label: 'Their role',
    hint: 'For example: Technical manager, proficiency testing.',
  },
  {
    key: 'subcontracting',
    label: 'Subcontracting statement',
    hint: 'Which work was subcontracted (for example homogeneity measurements), or that none was.',
    multiline: true,
  },
];

/** The PT provider's profile: who issues the reports (admins and coordinators edit it). */
@Component({
  selector: 'app-provider-profile',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonModule, FileDrop],
  styles: `
    .page {
      max-width: 760px;
      padding: 16px 24px;
    }
    .logo {
      display: flex;
      align-items: center;
      gap: 16px;
      margin: 8px 0 24px;
    }
    .logo img {
      max-width: 160px;
      max-height: 64px;
      border: 1px solid #c9cfd6;
      padding: 4px;
      background: #fff;
    }
    .form-stack {
      display: flex;
      flex-direction: column;
    }
  `,
  template: `
    <section class="page">
      <h1>PT provider</h1>
      <p>
        Every round report, individual report, certificate and e-mail made from now on prints this
        profile. Files already issued keep the profile they were made with.
      </p>
      <h2>Logo</h2>
      <div class="logo">
        @if (profile()?.hasLogo) {
          <img [src]="logoUrl()" alt="Current logo of the PT provider" />
          <button mat-button type="button" (click)="removeLogo()" [disabled]="busy()">
            Remove logo
          </button>
        } @else {
          <span>No logo yet.</span>
        }
        <app-file-drop
          label="Drop a PNG or JPEG logo here"
          accept="image/png,image/jpeg"
          [disabled]="busy()"
          (picked)="pickLogo($event)"
          testId="logo-file"
        />
      </div>
      <p class="hint">PNG or JPEG, at most {{ maxKb }} KB.</p>
      @if (logoFailure(); as message) {
        <p class="form-error" role="alert">{{ message }}</p>
      }
      <h2>Identity and contact</h2>
      <form [formGroup]="form" (ngSubmit)="save()" novalidate class="form-stack">
        @for (f of fields; track f.key) {
          <mat-form-field>
            <mat-label>{{ f.label }}</mat-label>
            @if (f.multiline) {
              <textarea matInput [formControlName]="f.key" rows="3"></textarea>
            } @else {
              <input matInput [formControlName]="f.key" />
            }
            @if (f.hint) {
              <mat-hint>{{ f.hint }}</mat-hint>
            }
            <mat-error>{{ errorMessage(form.get(f.key)) }}</mat-error>
          </mat-form-field>
        }
        <mat-form-field>
          <mat-label>Tax rate on participation fees (%)</mat-label>
          <input
            matInput
            type="number"
            min="0"
            max="100"
            step="0.01"
            formControlName="taxRatePercent"
          />
          <mat-hint>Printed on every new invoice; invoices already issued keep theirs.</mat-hint>
          <mat-error>{{
            errorMessage(form.get('taxRateBp') ?? form.controls.taxRatePercent)
          }}</mat-error>
        </mat-form-field>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
        @if (saved()) {
          <p role="status">Saved.</p>
        }
        <div>
          <button mat-flat-button type="submit" [disabled]="busy()">Save profile</button>
        </div>
      </form>
    </section>
  `,
})
export class ProviderProfilePage implements OnInit {
  private readonly service = inject(ProviderService);
  protected readonly fields = FIELDS;
  protected readonly errorMessage = errorMessage;
  protected readonly maxKb = LOGO_MAX_BYTES / 1024;
  protected readonly profile = signal<ProviderProfile | null>(null);
  protected readonly busy = signal(false);
  protected readonly saved = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly logoFailure = signal<string | null>(null);
  protected readonly logoUrl = signal(`${API}/provider/logo`);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [''],
    address: [''],
    contactEmail: [''],
    contactPhone: [''],
    website: [''],
    accreditationBody: [''],
    accreditationNumber: [''],
    authoriserName: [''],
    authoriserRole: [''],
    subcontracting: [''],
    taxRatePercent: [0],
  });

  ngOnInit(): void {
    this.service.profile().subscribe({
      next: (p) => this.show(p),
      error: (e: unknown) => this.failure.set(problemMessage(e)),
    });
  }

  private show(p: ProviderProfile): void {
    this.profile.set(p);
    this.logoUrl.set(`${API}/provider/logo?v=${encodeURIComponent(p.updatedAt)}`);
    this.form.reset({
      name: p.name,
      address: p.address,
      contactEmail: p.contactEmail,
      contactPhone: p.contactPhone,
      website: p.website,
      accreditationBody: p.accreditationBody,
      accreditationNumber: p.accreditationNumber,
      authoriserName: p.authoriserName,
      authoriserRole: p.authoriserRole,
      subcontracting: p.subcontracting,
      taxRatePercent: p.taxRateBp / 100,
    });
  }

  protected save(): void {
    this.failure.set(null);
    this.saved.set(false);
    const { taxRatePercent, ...raw } = this.form.getRawValue();
    const parsed = ProviderProfileInput.safeParse({
      ...raw,
      taxRateBp: Math.round(Number(taxRatePercent) * 100),
    });
    if (!parsed.success) {
      this.form.markAllAsTouched();
      const unplaced = applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    this.busy.set(true);
    this.service.save(parsed.data).subscribe({
      next: (p) => {
        this.busy.set(false);
        this.saved.set(true);
        this.show(p);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        if (error instanceof HttpErrorResponse && error.status === 400) {
          const unplaced = applyServerIssues(this.form, fieldIssuesOf(error));
          this.failure.set(unplaced.length ? unplaced.join(' ') : null);
        } else this.failure.set(problemMessage(error));
      },
    });
  }

  protected pickLogo(file: File): void {
    this.logoFailure.set(null);
    if (file.size > LOGO_MAX_BYTES) {
      this.logoFailure.set(`The logo may be at most ${this.maxKb} KB.`);
      return;
    }
    const reader = new FileReader();
    reader.onload = () => {
      // readAsDataURL: the result is a data: URL string
      const data = typeof reader.result === 'string' ? reader.result : '';
      const base64 = data.slice(data.indexOf(',') + 1);
      this.busy.set(true);
      this.service.setLogo(base64).subscribe({
        next: (p) => {
          this.busy.set(false);
          this.show(p);
        },
        error: (e: unknown) => {
          this.busy.set(false);
          this.logoFailure.set(fieldIssuesOf(e)[0]?.message ?? problemMessage(e));
        },
      });
    };
    reader.readAsDataURL(file);
  }

  protected removeLogo(): void {
    this.busy.set(true);
    this.service.removeLogo().subscribe({
      next: (p) => {
        this.busy.set(false);
        this.show(p);
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.logoFailure.set(problemMessage(e));
      },
    });
  }
}
