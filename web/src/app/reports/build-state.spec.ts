import { TestBed } from '@angular/core/testing';
import { BuildState } from './build-state';

describe('BuildState', () => {
  it.each([
    [{ status: 'queued', progress: 0, error: null }, 'Waiting to build', 'schedule'],
    [{ status: 'running', progress: 40, error: null }, 'Building 40 %', 'autorenew'],
    [{ status: 'done', progress: 100, error: null }, 'Ready', 'check_circle'],
    [{ status: 'failed', progress: 30, error: 'The file could not be built.' }, 'Failed', 'error'],
  ] as const)(
    'shows %o as a word with an icon, never the raw value',
    async (status, word, icon) => {
      const fixture = TestBed.createComponent(BuildState);
      fixture.componentRef.setInput('status', status);
      await fixture.whenStable();
      const el = (fixture.nativeElement as HTMLElement).querySelector(
        '[data-testid="build-state"]',
      )!;
      expect(el.querySelector('mat-icon')?.textContent?.trim()).toBe(icon);
      expect(el.textContent?.replace(icon, '').trim()).toBe(word);
      expect(el.getAttribute('data-state')).toBe(status.status);
      expect(el.classList).toContain(status.status);
    },
  );
});
