import {
  ChangeDetectionStrategy,
  Component,
  type ElementRef,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/**
 * A drop zone for one file: drag a file onto it, or press its button to choose one. While an upload
 * runs, `progress` (0–100) shows a progress bar; `null` hides it. The native input stays in the
 * page (visually hidden) so keyboard users and browser tests reach it.
 */
@Component({
  selector: 'app-file-drop',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <div
      class="drop"
      [class.over]="over()"
      [class.disabled]="disabled()"
      (dragover)="dragOver($event)"
      (dragleave)="over.set(false)"
      (drop)="dropped($event)"
    >
      <mat-icon aria-hidden="true">upload_file</mat-icon>
      <span class="label">{{ label() }}</span>
      <button
        mat-stroked-button
        type="button"
        [disabled]="disabled()"
        (click)="input().nativeElement.click()"
      >
        Choose a file
      </button>
      <input
        #file
        class="hidden-input"
        type="file"
        [accept]="accept()"
        [disabled]="disabled()"
        [attr.data-testid]="testId() || null"
        [attr.aria-label]="label()"
        (change)="changed($event)"
      />
      @if (chosen(); as name) {
        <span class="chosen">{{ name }}</span>
      }
    </div>
    @if (progress() !== null) {
      <mat-progress-bar
        mode="determinate"
        [value]="progress()"
        [attr.aria-label]="'Upload ' + progress() + ' %'"
      />
    }
  `,
  styles: `
    :host {
      display: block;
      flex: 1 1 260px;
      min-width: 0;
    }
    .drop {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px 12px;
      padding: 10px 12px;
      border: 1.5px dashed #8a9bb3;
      border-radius: 8px;
      background: #f6f8fb;
      color: #1f3a5f;
    }
    .drop.over {
      border-color: #1b7f79;
      background: #e8f4f3;
    }
    .drop.disabled {
      opacity: 0.6;
    }
    .label {
      flex: 1 1 160px;
    }
    .chosen {
      flex-basis: 100%;
      font-size: 0.9em;
      color: #44546a;
      overflow-wrap: anywhere;
    }
    .hidden-input {
      position: absolute;
      width: 1px;
      height: 1px;
      opacity: 0;
      overflow: hidden;
    }
    mat-progress-bar {
      margin-top: 4px;
    }
  `,
})
export class FileDrop {
  readonly label = input('Drop a file here');
  readonly accept = input('');
  readonly disabled = input(false);
  /** Upload progress 0–100, or null when nothing is uploading. */
  readonly progress = input<number | null>(null);
  readonly testId = input('');
  readonly picked = output<File>();
  protected readonly over = signal(false);
  protected readonly chosen = signal<string | null>(null);
  protected readonly input = viewChild.required<ElementRef<HTMLInputElement>>('file');

  protected dragOver(event: DragEvent): void {
    if (this.disabled()) return;
    event.preventDefault();
    this.over.set(true);
  }

  protected dropped(event: DragEvent): void {
    event.preventDefault();
    this.over.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file && !this.disabled()) this.emit(file);
  }

  protected changed(event: Event): void {
    const el = event.target as HTMLInputElement;
    const file = el.files?.[0];
    if (file) this.emit(file);
    el.value = '';
  }

  private emit(file: File): void {
    this.chosen.set(file.name);
    this.picked.emit(file);
  }
}
