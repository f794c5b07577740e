import { APIError } from 'better-auth';
import type { Auth } from '#server/auth.ts';
import type { Db } from '#server/db/client.ts';
import type { Auditor } from '#server/http/audit.ts';
import { conflict, HttpError, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import type { AcceptInvitationInput, CreateInvitationInput, Invitation, InvitationPublic } from '#shared/schemas/api-invitations.ts';
import { invitationStatuses } from '#shared/schemas/api-invitations.ts';
import { roleSchema } from '#shared/schemas/common.ts';
import { insertAudit } from '../audit/queries.ts';
import { deleteUser, findInvitationWithUnit, listUnitInvitations, markEmailVerified, userExistsWithEmail } from './queries.ts';

type Row = { id: string; email: string; role: string | null; status: string; expiresAt: Date };

/** A pending invitation past its date reads as expired (better-auth leaves the stored status alone). */
function toInvitation(r: Row): Invitation {
  const stored = invitationStatuses.find((s) => s === r.status) ?? 'canceled';
  const status = stored === 'pending' && r.expiresAt.getTime() <= Date.now() ? 'expired' : stored;
  return { id: r.id, email: r.email, role: roleSchema.parse(r.role), status, expiresAt: r.expiresAt.toISOString() };
}

/**
 * better-auth's refusals keep their message; "already a member / already exists" is a conflict (409),
 * other refusals keep their status. Anything that is not an APIError is a real fault.
 */
function fromAuthError(error: unknown, field?: string): never {
  if (error instanceof APIError) {
    const message = error.body?.message ?? error.message;
    const issues = field ? [{ path: field, message }] : undefined;
    const code = String(error.body?.code ?? '');
    throw new HttpError(/ALREADY|EXISTS/.test(code) ? 409 : error.statusCode, message, issues);
  }
  throw error;
}

/** Invite by e-mail into the admin's unit; better-auth stores it and sends the mail (server/auth.ts). */
export async function inviteMember(auth: Auth, actor: Actor, headers: Headers, input: CreateInvitationInput, audit: Auditor, db: Db): Promise<Invitation> {
  const created = await auth.api.createInvitation({ headers, body: { email: input.email, role: input.role, organizationId: actor.unitId } })
    .catch((e: unknown) => fromAuthError(e, 'email'));
  await audit(db, { action: 'invitation.create', entityType: 'invitation', entityId: created.id, detail: { email: input.email, role: input.role } });
  return toInvitation(created);
}

export async function unitInvitations(db: Db, unitId: string): Promise<Invitation[]> {
  return (await listUnitInvitations(db, unitId)).map(toInvitation);
}

export async function publicInvitation(db: Db, id: string): Promise<InvitationPublic> {
  const row = await findInvitationWithUnit(db, id);
  if (!row) throw notFound('No such invitation');
  return { ...toInvitation(row), unit: { id: row.unitId, name: row.unitName, hospital: row.hospital } };
}

/** `name=value` pairs of Set-Cookie headers, as a Cookie request header. */
const cookieHeader = (setCookies: string[]) => setCookies.map((c) => c.split(';', 1)[0]).join('; ');

/**
 * The invitee's first visit: make the account for the invited e-mail, join the unit with the invited
 * role, and hand back the session cookies. Holding the link proves the mailbox, so the e-mail counts
 * as verified. An e-mail that already has an account signs in and accepts through better-auth instead.
 */
export async function acceptAsNewUser(auth: Auth, db: Db, id: string, input: AcceptInvitationInput, ip: string | null) {
  const invitation = await publicInvitation(db, id);
  if (invitation.status !== 'pending') throw conflict(`This invitation is ${invitation.status}; ask your unit administrator for a new one`);
  if (await userExistsWithEmail(db, invitation.email)) {
    throw conflict('An account with this e-mail exists already: sign in, then open the invitation link again');
  }
  const signUp = await auth.api.signUpEmail({ body: { email: invitation.email, password: input.password, name: input.name }, returnHeaders: true })
    .catch((e: unknown) => fromAuthError(e, 'password'));
  const setCookies = signUp.headers.getSetCookie();
  const userId = signUp.response.user.id;
  await markEmailVerified(db, userId);
  // An account made for this invitation and left without its unit would block the invitee for good
  // ("an account with this e-mail exists"): if the acceptance fails, the account goes too.
  const accepted = await auth.api.acceptInvitation({ body: { invitationId: id }, headers: new Headers({ cookie: cookieHeader(setCookies) }), returnHeaders: true })
    .catch(async (e: unknown) => {
      await deleteUser(db, userId);
      return fromAuthError(e);
    });
  await insertAudit(db, { userId, unitId: invitation.unit.id, action: 'invitation.accept', entityType: 'invitation', entityId: id, detail: { role: invitation.role }, ip });
  return {
    setCookies: [...setCookies, ...accepted.headers.getSetCookie()],
    body: { userId, unit: invitation.unit, role: invitation.role },
  };
}
