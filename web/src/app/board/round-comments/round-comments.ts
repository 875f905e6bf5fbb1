import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { problemMessage } from '../../core/problem';
import { ProviderService } from '../../provider/provider-service';

/** The coordinator's comments on a round, printed in the round report; editable until published. */
@Component({
  selector: 'app-round-comments',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './round-comments.html',
  styleUrl: '../board.scss',
})
export class RoundComments {
  readonly roundId = input.required<string>();
  /** Changes whenever the evaluation was read again (comments close on publication). */
  readonly version = input<unknown>();
  /** What happened: a message for the page's status line, or an error. */
  readonly saved = output<string>();
  readonly failed = output<string>();
  private readonly provider = inject(ProviderService);
  protected readonly comments = inject(NonNullableFormBuilder).control('');
  protected readonly editable = signal(false);

  constructor() {
    effect(() => {
      const id = this.roundId();
      this.version();
      untracked(() =>
        this.provider.comments(id).subscribe({
          next: (c) => {
            this.comments.setValue(c.comments);
            this.editable.set(c.editable);
          },
          error: () => this.editable.set(false),
        }),
      );
    });
  }

  protected save(): void {
    this.provider.saveComments(this.roundId(), this.comments.value).subscribe({
      next: (c) => {
        this.comments.setValue(c.comments);
        this.editable.set(c.editable);
        this.saved.emit('Comments saved; the round report prints them.');
      },
      error: (e: unknown) => this.failed.emit(problemMessage(e)),
    });
  }
}
