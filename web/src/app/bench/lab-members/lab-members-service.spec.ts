import { HttpErrorResponse } from '@angular/common/http';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { HANDLED_STATUSES } from '../../core/api';
import { httpTestBed } from '../../core/testing';
import { aGrant, GRANT_LAB } from './grant-fixtures';
import { grantState } from './grant-state';
import { LabMembersService } from './lab-members-service';

const LAB = GRANT_LAB;
const GRANT = aGrant().id;

describe('LabMembersService: assessor grants', () => {
  let service: LabMembersService;
  let http: HttpTestingController;

  beforeEach(() => {
    http = httpTestBed();
    service = TestBed.inject(LabMembersService);
  });
  afterEach(() => http.verify());

  it('lists the lab’s grants and parses them with the shared contract', async () => {
    const listed = firstValueFrom(service.grants(LAB));
    const req = http.expectOne({ method: 'GET', url: `/api/v1/labs/${LAB}/assessor-grants` });
    req.flush([
      aGrant(),
      aGrant({
        id: '1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d',
        revokedAt: '2026-03-02T10:00:00.000Z',
        isActive: false,
      }),
    ]);
    const grants = await listed;
    expect(grants).toHaveLength(2);
    expect(grants[1]!.revokedAt).toBe('2026-03-02T10:00:00.000Z');
  });

  it('refuses a list that does not match the contract', async () => {
    const listed = firstValueFrom(service.grants(LAB));
    http.expectOne(`/api/v1/labs/${LAB}/assessor-grants`).flush([{ id: 'not-a-uuid' }]);
    await expect(listed).rejects.toThrow();
  });

  it('posts a grant and lets the form handle 400 and 422 itself', async () => {
    const body = {
      email: 'tove.lindqvist@example.test',
      name: 'Tove Lindqvist',
      startsOn: '2026-01-01',
      endsOn: '2026-12-31',
    };
    const created = firstValueFrom(service.grant(LAB, body));
    const req = http.expectOne({ method: 'POST', url: `/api/v1/labs/${LAB}/assessor-grants` });
    expect(req.request.body).toEqual(body);
    // the error interceptor must stay quiet for these: the form shows them under the fields
    expect(req.request.context.get(HANDLED_STATUSES)).toEqual([400, 422]);
    req.flush(aGrant());
    expect((await created).assessorEmail).toBe('tove.lindqvist@example.test');
  });

  it('passes a 422 rule break through to the caller', async () => {
    const created = firstValueFrom(
      service.grant(LAB, { email: 'lab.manager@example.test', endsOn: '2026-12-31' }),
    );
    http.expectOne({ method: 'POST', url: `/api/v1/labs/${LAB}/assessor-grants` }).flush(
      {
        error: {
          code: 'not_an_assessor',
          message:
            "email: lab.manager@example.test belongs to an account that is not an assessor's.",
        },
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    const error = await created.then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(HttpErrorResponse);
    expect((error as HttpErrorResponse).status).toBe(422);
  });

  it('revokes a grant with DELETE and completes on 204', async () => {
    const done = firstValueFrom(service.revokeGrant(LAB, GRANT), { defaultValue: 'no value' });
    const req = http.expectOne({
      method: 'DELETE',
      url: `/api/v1/labs/${LAB}/assessor-grants/${GRANT}`,
    });
    req.flush(null, { status: 204, statusText: 'No Content' });
    expect(await done).toBeUndefined();
  });
});

describe('grantState', () => {
  const today = '2026-06-15';
  it('names revoked first, then active, ended and upcoming', () => {
    expect(
      grantState(aGrant({ revokedAt: '2026-06-01T08:00:00.000Z', isActive: false }), today),
    ).toBe('revoked');
    expect(grantState(aGrant(), today)).toBe('active');
    expect(grantState(aGrant({ endsOn: '2026-06-14', isActive: false }), today)).toBe('ended');
    expect(grantState(aGrant({ startsOn: '2026-07-01', isActive: false }), today)).toBe('upcoming');
  });
});
