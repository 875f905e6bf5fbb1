import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import {
  Membership,
  Organisation,
  type OrganisationCreate,
  User,
  type UserInvite,
  type UserUpdate,
  type MembershipCreate,
} from '@ringlet/shared/contracts/admin';
import { API, HANDLED_STATUSES } from '../core/api';

/** Forms show their own 400 field errors; everything else goes to the snackbar. */
const formCall = { context: new HttpContext().set(HANDLED_STATUSES, [400]) };

/** Admin calls: users, labs (organisations) and memberships. Responses are parsed here. */
@Injectable({ providedIn: 'root' })
export class AdminService {
  private readonly http = inject(HttpClient);

  users(): Observable<User[]> {
    return this.http
      .get<unknown>(`${API}/admin/users`)
      .pipe(map((body) => z.array(User).parse(body)));
  }

  /** Creates the account and e-mails a first-password link. */
  inviteUser(invite: UserInvite): Observable<User> {
    return this.http
      .post<unknown>(`${API}/admin/users`, invite, formCall)
      .pipe(map((body) => User.parse(body)));
  }

  updateUser(id: string, update: UserUpdate): Observable<User> {
    return this.http
      .patch<unknown>(`${API}/admin/users/${id}`, update, formCall)
      .pipe(map((body) => User.parse(body)));
  }

  /** Sends a fresh first-password link. */
  resendInvitation(id: string): Observable<void> {
    return this.http.post(`${API}/admin/users/${id}/invitation`, null).pipe(map(() => undefined));
  }

  organisations(): Observable<Organisation[]> {
    return this.http
      .get<unknown>(`${API}/admin/organisations`)
      .pipe(map((body) => z.array(Organisation).parse(body)));
  }

  createOrganisation(create: OrganisationCreate): Observable<Organisation> {
    return this.http
      .post<unknown>(`${API}/admin/organisations`, create, formCall)
      .pipe(map((body) => Organisation.parse(body)));
  }

  updateOrganisation(id: string, update: Partial<OrganisationCreate>): Observable<Organisation> {
    return this.http
      .patch<unknown>(`${API}/admin/organisations/${id}`, update, formCall)
      .pipe(map((body) => Organisation.parse(body)));
  }

  memberships(organisationId: string): Observable<Membership[]> {
    return this.http
      .get<unknown>(`${API}/admin/organisations/${organisationId}/memberships`)
      .pipe(map((body) => z.array(Membership).parse(body)));
  }

  addMembership(create: MembershipCreate): Observable<Membership> {
    return this.http
      .post<unknown>(`${API}/admin/memberships`, create, formCall)
      .pipe(map((body) => Membership.parse(body)));
  }

  setManager(membershipId: string, isManager: boolean): Observable<Membership> {
    return this.http
      .patch<unknown>(`${API}/admin/memberships/${membershipId}`, { isManager })
      .pipe(map((body) => Membership.parse(body)));
  }

  removeMembership(membershipId: string): Observable<void> {
    return this.http.delete(`${API}/admin/memberships/${membershipId}`).pipe(map(() => undefined));
  }
}
