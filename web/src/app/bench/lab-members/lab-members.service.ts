import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import { z } from 'zod';
import { type LabMemberInvite, Membership } from '@ringlet/shared/contracts/admin';
import { API, HANDLED_STATUSES } from '../../core/api';

/** A lab manager's calls for their own lab's members. */
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
}
