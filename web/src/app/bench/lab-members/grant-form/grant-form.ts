import { ChangeDetectionStrategy, Component, inject, input, output } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { AssessorGrantCreate, type AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { Email } from '@ringlet/shared/contracts/common';
import { errorMessage, zodValidator } from '../../../core/zod-form-errors';
import { FormSubmit } from '../../../shared/form-submit';
import { utcToday } from '../grant-state';
import { LabMembersService } from '../lab-members-service';

/** Gives an assessor read access to the lab for a period; the assessor is invited by e-mail. */
@Component({
  selector: 'app-grant-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './grant-form.html',
  styles: `
    .grant-form {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      align-items: flex-start;
    }
    .grant-form button {
      margin-top: 8px;
    }
  `,
})
export class GrantForm {
  readonly labId = input.required<string>();
  readonly granted = output<AssessorGrantDto>();
  private readonly service = inject(LabMembersService);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: [''],
    startsOn: [utcToday(), [Validators.required]],
    endsOn: ['', [Validators.required]],
  });
  protected readonly submit = new FormSubmit(this.form);

  protected save(): void {
    const v = this.form.getRawValue();
    const grant = this.submit.parse(AssessorGrantCreate, {
      email: v.email,
      name: v.name.trim() || undefined,
      startsOn: v.startsOn || undefined,
      endsOn: v.endsOn || undefined,
    });
    // the contract refuses an end before the start, under "Until"
    if (!grant || this.form.invalid) return this.form.markAllAsTouched();
    this.submit.run(this.service.grant(this.labId(), grant), (saved) => {
      this.granted.emit(saved);
      this.form.reset({ email: '', name: '', startsOn: utcToday(), endsOn: '' });
      this.snackBar.open(`Access granted; invitation sent to ${saved.assessorEmail}.`, 'Close', {
        duration: 5000,
      });
    });
  }
}
