import {
  HttpHeaders,
  type HttpEvent,
  type HttpInterceptorFn,
  HttpResponse,
} from '@angular/common/http';
import { type Observable, from, of, switchMap } from 'rxjs';
import { EARLY_GLOBAL, type EarlyRequests } from '../../early/early-calls';

/**
 * Answers asked for before the app started (web/src/early): who is signed in and the first
 * page's data. Each is taken once, by the first GET for the same URL; what is left is dropped
 * once the first page has opened (dropEarlyResponses), so no later call gets an old answer.
 */
function early(): EarlyRequests | undefined {
  return (globalThis as unknown as Record<string, EarlyRequests | undefined>)[EARLY_GLOBAL];
}

/** The early answer for `url`, removed so it is used once; undefined when there is none. */
export function takeEarlyResponse(url: string): Promise<Response> | undefined {
  const requests = early();
  const answer = requests?.get(url);
  requests?.delete(url);
  return answer;
}

export function dropEarlyResponses(): void {
  early()?.clear();
}

/** A successful JSON answer as HttpClient gives it; null otherwise (the app then asks itself). */
async function asHttpResponse(answer: Promise<Response>): Promise<HttpResponse<unknown> | null> {
  try {
    const r = await answer;
    if (!r.ok) return null;
    const text = await r.text();
    return new HttpResponse({
      body: text === '' ? null : (JSON.parse(text) as unknown),
      headers: new HttpHeaders({ 'Content-Type': r.headers.get('Content-Type') ?? '' }),
      status: r.status,
      statusText: r.statusText,
      url: r.url,
    });
  } catch {
    return null;
  }
}

/**
 * Innermost interceptor: a plain JSON GET whose URL the early script already asked for gets that
 * answer instead of a second request. A failed or refused early answer is not used: the request
 * then goes out as usual, so errors are handled exactly as before.
 */
export const earlyResponseInterceptor: HttpInterceptorFn = (req, next) => {
  if (req.method !== 'GET' || req.responseType !== 'json') return next(req);
  const answer = takeEarlyResponse(req.urlWithParams);
  if (!answer) return next(req);
  return from(asHttpResponse(answer)).pipe(
    switchMap((res): Observable<HttpEvent<unknown>> => (res ? of(res) : next(req))),
  );
};
