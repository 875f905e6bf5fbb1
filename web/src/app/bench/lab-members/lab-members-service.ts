import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import {
  LabInvitation,
  type LabMemberInvite,
  LabMemberInviteResult,
  Membership,
} from '@ringlet/shared/contracts/admin';
import { type AssessorGrantCreate, AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { API, HANDLED_STATUSES } from '../../core/api';

/** A lab manager's calls for their own lab's members and assessor grants. */
@Injectable({ providedIn: 'root' })
export class LabMembersService {
  private readonly http = inject(HttpClient);

  members(labId: string): Observable<Membership[]> {
    return this.http
      .get<unknown>(`${API}/labs/${labId}/members`)
      .pipe(map((body) => z.array(Membership).parse(body)));
  }

  /**
   * A new address gets an account and the membership (with a first-password link); an existing
   * account gets an invitation it must accept. The form shows 400, 409 and 422 itself.
   */
  invite(labId: string, invite: LabMemberInvite): Observable<LabMemberInviteResult> {
    return this.http
      .post<unknown>(`${API}/labs/${labId}/members`, invite, {
        context: new HttpContext().set(HANDLED_STATUSES, [400, 409, 422]),
      })
      .pipe(map((body) => LabMemberInviteResult.parse(body)));
  }

  /** Invitations of the lab not answered yet. */
  invitations(labId: string): Observable<LabInvitation[]> {
    return this.http
      .get<unknown>(`${API}/labs/${labId}/invitations`)
      .pipe(map((body) => z.array(LabInvitation).parse(body)));
  }

  withdrawInvitation(labId: string, invitationId: string): Observable<void> {
    return this.http
      .delete(`${API}/labs/${labId}/invitations/${invitationId}`)
      .pipe(map(() => undefined));
  }

  remove(labId: string, membershipId: string): Observable<void> {
    return this.http
      .delete(`${API}/labs/${labId}/members/${membershipId}`)
      .pipe(map(() => undefined));
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
    return this.http
      .delete(`${API}/labs/${labId}/assessor-grants/${grantId}`)
      .pipe(map(() => undefined));
  }
}
