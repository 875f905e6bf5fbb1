import { type HttpInterceptorFn, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { EnvironmentProviders, Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { Membership } from '@ringlet/shared/contracts/admin';
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

/** A lab user of one lab (invented), its manager or not. */
export function aLabMember(isManager: boolean): Me {
  return aMe({
    roles: ['lab'],
    memberships: [
      {
        id: '0d7c1f7a-1111-4a2b-8c3d-000000000001',
        organisationId: '0d7c1f7a-2222-4a2b-8c3d-000000000002',
        organisationName: 'Harbourside Colloid Lab',
        isManager,
      },
    ],
  });
}

/**
 * Configures the TestBed with an HttpClient whose requests pass `interceptors` and end at the
 * testing backend, beside any other `providers`; answers the backend's controller (verify it
 * after each test).
 */
export function httpTestBed(
  interceptors: HttpInterceptorFn[] = [],
  providers: (Provider | EnvironmentProviders)[] = [],
): HttpTestingController {
  TestBed.configureTestingModule({
    providers: [
      ...providers,
      provideHttpClient(withInterceptors(interceptors)),
      provideHttpClientTesting(),
    ],
  });
  return TestBed.inject(HttpTestingController);
}

/** Lets pending promises (lazy contract loading, async guards) settle. */
export function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** A membership of one invented lab (member n, its manager or not). */
export function aMembership(n: number, isManager: boolean): Membership {
  return {
    id: `0d7c1f7a-1111-4a2b-8c3d-00000000000${n}`,
    userId: `0d7c1f7a-3333-4a2b-8c3d-00000000000${n}`,
    userEmail: `member${n}@example.test`,
    userName: `Member ${n}`,
    organisationId: '0d7c1f7a-2222-4a2b-8c3d-000000000002',
    organisationName: 'Harbourside Colloid Lab',
    isManager,
  };
}
