import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import * as z from 'zod';
import { type LabMemberInvite, Membership } from '@ringlet/shared/contracts/admin';
import { type AssessorGrantCreate, AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { API, HANDLED_STATUSES } from '../../core/api';

/** A lab manager's calls for their own lab's members and assessor grants. */
@Injectable({ providedIn: 'root' })
export class LabMembersService {
  private readonly http = inject(HttpClient);

  members(labId: string): Observable<Membership[]> {
    return this.http.get<unknown>(`${API}/labs/${labId}/members`).pipe(map((body) => z.array(Membership).parse(body)));
  }

  /** Creates the colleague's account if needed and e-mails a first-password link. */
  invite(labId: string, invite: LabMemberInvite): Observable<Membership> {
    return this.http
      .post<unknown>(`${API}/labs/${labId}/members`, invite, {
        context: new HttpContext().set(HANDLED_STATUSES, [400]),
      })
      .pipe(map((body) => Membership.parse(body)));
  }

  remove(labId: string, membershipId: string): Observable<void> {
    return this.http.delete(`${API}/labs/${labId}/members/${membershipId}`).pipe(map(() => undefined));
  }

  /** The assessors this lab gave access, newest first (active, ended and revoked). */
  grants(labId: string): Observable<AssessorGrantDto[]> {
    return this.http
      .get<unknown>(`${API}/labs/${labId}/assessor-grants`)
      .pipe(map((body) => z.array(AssessorGrantDto).parse(body)));
  }

  /**
   * Gives an assessor access from `startsOn` to `endsOn`; the server creates the assessor's
   * account if needed and e-mails the invitation. The form shows 400 field errors and 422 rule
   * breaks (e.g. the e-mail belongs to a non-assessor) itself.
   */
  grant(labId: string, grant: AssessorGrantCreate): Observable<AssessorGrantDto> {
    return this.http
      .post<unknown>(`${API}/labs/${labId}/assessor-grants`, grant, {
        context: new HttpContext().set(HANDLED_STATUSES, [400, 422]),
      })
      .pipe(map((body) => AssessorGrantDto.parse(body)));
  }

  /** Ends a grant now; the assessor loses access at once. */
  revokeGrant(labId: string, grantId: string): Observable<void> {
    return this.http.delete(`${API}/labs/${labId}/assessor-grants/${grantId}`).pipe(map(() => undefined));
  }
}
