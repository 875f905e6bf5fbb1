import { TestBed } from '@angular/core/testing';
import { SignalBadge, type SignalKind } from './signal-badge';

describe('SignalBadge', () => {
  const cases: [SignalKind, string, string][] = [
    ['acceptable', 'Acceptable', 'circle'],
    ['warning', 'Warning', 'triangle'],
    ['action', 'Action', 'diamond'],
  ];

  it.each(cases)(
    'shows %s with its word and its shape, not colour alone',
    async (signal, word, shape) => {
      const fixture = TestBed.createComponent(SignalBadge);
      fixture.componentRef.setInput('signal', signal);
      await fixture.whenStable();
      const host = fixture.nativeElement as HTMLElement;
      expect(host.textContent?.trim()).toBe(word);
      const svg = host.querySelector('svg');
      expect(svg?.getAttribute('data-shape')).toBe(shape);
      expect(svg?.getAttribute('aria-hidden')).toBe('true');
      expect(svg?.querySelector(shape === 'circle' ? 'circle' : 'polygon')).not.toBeNull();
      expect(host.classList).toContain(`signal-${signal}`);
    },
  );

  it('gives each signal a different shape', () => {
    expect(new Set(cases.map(([, , shape]) => shape)).size).toBe(3);
  });

  it('can show other wording while keeping the shape', async () => {
    const fixture = TestBed.createComponent(SignalBadge);
    fixture.componentRef.setInput('signal', 'action');
    fixture.componentRef.setInput('label', 'Action signal');
    await fixture.whenStable();
    const host = fixture.nativeElement as HTMLElement;
    expect(host.textContent?.trim()).toBe('Action signal');
    expect(host.querySelector('svg')?.getAttribute('data-shape')).toBe('diamond');
  });
});
