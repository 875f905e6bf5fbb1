import { type HttpInterceptorFn, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Me } from '@ringlet/shared/contracts/auth';

/** A signed-in user for specs (invented). */
export function aMe(overrides: Partial<Me> = {}): Me {
  return {
    id: '6f1d2c7e-4b8a-4c8e-9a51-2f7f0c1d9b10',
    email: 'mira.okafor@example.test',
    name: 'Mira Okafor',
    roles: ['coordinator'],
    memberships: [],
    ...overrides,
  };
}

/** Lets pending promises (lazy contract loading, async guards) settle. */
export function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** Sets up TestBed with HttpClient through `interceptors` and the testing backend. */
export function httpTesting(interceptors: HttpInterceptorFn[]): HttpTestingController {
  TestBed.configureTestingModule({
    providers: [provideHttpClient(withInterceptors(interceptors)), provideHttpClientTesting()],
  });
  return TestBed.inject(HttpTestingController);
}
