import { TestBed } from '@angular/core/testing';
import { ListAction } from './list-action';

async function render(inputs: Record<string, unknown>) {
  TestBed.configureTestingModule({ imports: [ListAction] });
  const fixture = TestBed.createComponent(ListAction);
  for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
  let acted = 0;
  fixture.componentInstance.act.subscribe(() => acted++);
  await fixture.whenStable();
  const button = (fixture.nativeElement as HTMLElement).querySelector('button')!;
  return { button, acted: () => acted };
}

describe('ListAction', () => {
  it('is a plain button named for the entry it acts on, and says when pressed', async () => {
    const { button, acted } = await render({
      label: 'Withdraw',
      ariaLabel: 'Withdraw the decision on P07',
      testId: 'withdraw-decision',
    });
    expect(button.type).toBe('button');
    expect(button.textContent?.trim()).toBe('Withdraw');
    expect(button.getAttribute('aria-label')).toBe('Withdraw the decision on P07');
    expect(button.dataset['testid']).toBe('withdraw-decision');
    expect(button.classList).toContain('mat-mdc-button');
    button.click();
    expect(acted()).toBe(1);
  });

  it('has no test id unless given one, and an outline for the main step', async () => {
    const { button } = await render({ label: 'Decide', ariaLabel: 'Decide on P07', stroked: true });
    expect(button.hasAttribute('data-testid')).toBe(false);
    expect(button.classList).toContain('mat-mdc-outlined-button');
  });
});
