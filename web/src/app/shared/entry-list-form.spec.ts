import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatInputHarness } from '@angular/material/input/testing';
import { EntryListForm, type ListedEntry } from './entry-list-form';
import { renderHost } from './form-testing';

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [EntryListForm, ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <app-entry-list-form
      heading="Notes"
      [form]="form"
      [reason]="form.controls.reason"
      reasonTestId="note-reason"
      submitLabel="Add"
      submitTestId="add-note"
      [entries]="entries()"
      (submitted)="submitted.push(form.getRawValue())"
      (removed)="removed.push($event)"
    >
      <mat-form-field>
        <mat-label>Code</mat-label>
        <input matInput [formControl]="form.controls.code" data-testid="note-code" />
      </mat-form-field>
    </app-entry-list-form>
  `,
})
class Host {
  readonly form = inject(NonNullableFormBuilder).group({ code: [''], reason: [''] });
  readonly entries = signal<ListedEntry[]>([
    { text: 'P01: first', removeLabel: 'Remove P01' },
    { text: 'P02: second', removeLabel: 'Remove P02' },
  ]);
  readonly submitted: unknown[] = [];
  readonly removed: number[] = [];
}

const setup = () => renderHost(Host);

describe('EntryListForm', () => {
  it('submits the projected fields with the reason through its own button', async () => {
    const { fixture, loader } = await setup();
    const input = (id: string) =>
      loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
    await (await input('note-code')).setValue('P03');
    await (await input('note-reason')).setValue('late');
    const add = await loader.getHarness(MatButtonHarness.with({ text: 'Add' }));
    expect(await (await add.host()).getAttribute('data-testid')).toBe('add-note');
    await add.click();
    expect(fixture.componentInstance.submitted).toEqual([{ code: 'P03', reason: 'late' }]);
    expect((fixture.nativeElement as HTMLElement).querySelector('h2')?.textContent).toBe('Notes');
  });

  it('lists the entries, each with a remove button named for it', async () => {
    const { fixture, loader } = await setup();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('P01: first');
    expect(text).toContain('P02: second');
    await (
      await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Remove P02"]' }))
    ).click();
    expect(fixture.componentInstance.removed).toEqual([1]);
  });
});
