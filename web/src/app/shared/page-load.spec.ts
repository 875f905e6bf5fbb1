import { HttpErrorResponse } from '@angular/common/http';
import { Subject, of, throwError } from 'rxjs';
import { PageLoad } from './page-load';

const notFound = new HttpErrorResponse({ status: 404, statusText: 'Not Found', url: '/x' });

describe('PageLoad', () => {
  it('shows the value read and runs the follow-up with it', () => {
    const seen: number[] = [];
    const page = new PageLoad(() => of(7));
    page.load((v) => seen.push(v));
    expect(page.value()).toBe(7);
    expect(page.error()).toBeNull();
    expect(seen).toEqual([7]);
  });

  it('turns a refusal into the readable message and keeps no value', () => {
    const page = new PageLoad<number>(() => throwError(() => notFound));
    page.load();
    expect(page.value()).toBeNull();
    expect(page.error()).toBe('Not found.');
  });

  it('asks the source again on every load and clears an earlier message', () => {
    const answers = [throwError(() => notFound), of('second')];
    let asked = 0;
    const page = new PageLoad<string>(() => answers[asked++]!);
    page.load();
    expect(page.error()).toBe('Not found.');
    page.load();
    expect(asked).toBe(2);
    expect(page.value()).toBe('second');
    expect(page.error()).toBeNull();
  });

  it('lets the page explain a refusal its own way, or show none', () => {
    const page = new PageLoad<number>(
      () => throwError(() => notFound),
      (e) => (e instanceof HttpErrorResponse && e.status === 404 ? null : 'other'),
    );
    page.error.set('earlier');
    page.load();
    expect(page.error()).toBeNull();
  });

  it('reads lazily: nothing is asked before load()', () => {
    const source = new Subject<number>();
    let asked = 0;
    const page = new PageLoad(() => {
      asked++;
      return source;
    });
    expect(asked).toBe(0);
    page.load();
    source.next(3);
    expect(asked).toBe(1);
    expect(page.value()).toBe(3);
  });
});
