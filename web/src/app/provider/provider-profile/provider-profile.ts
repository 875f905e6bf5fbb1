import { ChangeDetectionStrategy, Component, inject, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { ProviderProfileInput, type ProviderProfile } from '@ringlet/shared/contracts/provider';
import { problemMessage } from '../../core/problem';
import { errorMessage } from '../../core/zod-form-errors';
import { FormSubmit } from '../../shared/form-submit';
import { ProviderLogo } from '../provider-logo/provider-logo';
import { ProviderService } from '../provider-service';
import { FIELDS, formValueOf, profileInputOf } from './profile-form';

/** The PT provider's profile: who issues the reports (admins and coordinators edit it). */
@Component({
  selector: 'app-provider-profile',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonModule, ProviderLogo],
  templateUrl: './provider-profile.html',
  styleUrl: './provider-profile.scss',
})
export class ProviderProfilePage implements OnInit {
  private readonly service = inject(ProviderService);
  protected readonly fields = FIELDS;
  protected readonly errorMessage = errorMessage;
  protected readonly profile = signal<ProviderProfile | null>(null);
  protected readonly saved = signal(false);
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
  protected readonly submit = new FormSubmit(this.form);

  ngOnInit(): void {
    this.service.profile().subscribe({
      next: (p) => this.show(p),
      error: (e: unknown) => this.submit.failure.set(problemMessage(e)),
    });
  }

  protected show(p: ProviderProfile): void {
    this.profile.set(p);
    this.form.reset(formValueOf(p));
  }

  protected save(): void {
    this.saved.set(false);
    this.submit.submit(
      ProviderProfileInput,
      profileInputOf(this.form.getRawValue()),
      (value) => this.service.save(value),
      (p) => {
        this.saved.set(true);
        this.show(p);
      },
    );
  }
}
