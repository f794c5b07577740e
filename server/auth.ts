import { APIError, betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { createAccessControl } from 'better-auth/plugins/access';
import { organization, type OrganizationOptions } from 'better-auth/plugins/organization';
import { adminAc, defaultStatements } from 'better-auth/plugins/organization/access';
import type { Logger } from 'pino';
import type { Config } from './config.ts';
import type { Db } from './db/client.ts';
import { CLIENT_ADDRESS_HEADER } from './http/client-address.ts';
import type { Mailer } from './services/mail.ts';
import { permissionMatrix, statements } from '#shared/domain/permissions.ts';
import { roles, roleSchema, type Role } from '#shared/schemas/common.ts';
import { findPendingInvitationByEmail } from './modules/invitations/queries.ts';
import { firstMembership } from './modules/members/queries.ts';
import { invitationMail, resetPasswordMail } from './modules/invitations/mails.ts';

export interface AuthDeps {
  db: Db;
  config: Config;
  mailer: Mailer;
  /** better-auth's own messages go to the server's log (else to the console). */
  logger?: Logger;
}

/**
 * Access control for the organization plugin, built from the one role matrix
 * (shared/domain/permissions.ts). The plugin's own statements (inviting, member changes) go to admin only.
 */
export const ac = createAccessControl({ ...defaultStatements, ...statements });

function grantsOf(role: Role): Record<string, string[]> {
  const grants: Record<string, string[]> = {};
  for (const action of Object.keys(permissionMatrix[role])) {
    const [resource, verb] = action.split('.') as [string, string];
    (grants[resource] ??= []).push(verb);
  }
  return grants;
}

type AccessRole = ReturnType<typeof ac.newRole>;
export const accessRoles = Object.fromEntries(
  roles.map((role): [Role, AccessRole] => [role, ac.newRole({ ...(role === 'admin' ? adminAc.statements : {}), ...grantsOf(role) } as never)]),
) as Record<Role, AccessRole>;

/** The organization plugin as Ledgerline uses it: one organization = one hospital unit. */
export function unitPlugin(sendInvitationEmail?: OrganizationOptions['sendInvitationEmail']) {
  return organization({
    ac,
    roles: accessRoles,
    // The unit's first administrator is made by the seed or an operator, never by sign-up.
    allowUserToCreateOrganization: false,
    creatorRole: 'admin',
    invitationExpiresIn: 7 * 24 * 60 * 60,
    // The plugin's defaults (100 members, 100 pending invitations) would refuse a large unit's next
    // member only once the invitation is accepted; Ledgerline sets no cap of its own.
    membershipLimit: 100_000,
    invitationLimit: 100_000,
    cancelPendingInvitationsOnReInvite: true,
    sendInvitationEmail,
    schema: {
      organization: {
        additionalFields: {
          /** The hospital the unit belongs to (shown beside the unit's name). */
          hospital: { type: 'string', required: true, input: true },
          /** IANA zone of the unit's calendar ("today" on the case list). */
          timeZone: { type: 'string', required: false, defaultValue: 'UTC', input: true },
        },
      },
    },
  });
}

/** The options that shape the database (server/db/generate-auth-schema.ts writes the tables from them). */
export const authSchemaOptions = {
  advanced: { database: { generateId: 'uuid' as const } },
  plugins: [unitPlugin()],
};

/**
 * Sign-up is by invitation only. A request from a browser may create a user only for an e-mail that
 * holds a pending, unexpired invitation; calls made by the server itself (the seed, the accept route,
 * tests) carry no request and are trusted, as better-auth treats its own server-side calls.
 */
async function refuseUninvited(db: Db, email: string, hasRequest: boolean): Promise<void> {
  if (!hasRequest) return;
  if (await findPendingInvitationByEmail(db, email)) return;
  throw new APIError('FORBIDDEN', { message: 'Sign-up is by invitation only; ask your unit administrator for an invitation', code: 'INVITATION_REQUIRED' });
}

export function createAuth({ db, config, mailer, logger }: AuthDeps) {
  const appUrl = config.BETTER_AUTH_URL.replace(/\/$/, '');
  return betterAuth({
    appName: 'Ledgerline',
    baseURL: appUrl,
    basePath: '/api/auth',
    secret: config.BETTER_AUTH_SECRET,
    trustedOrigins: [appUrl],
    database: drizzleAdapter(db, { provider: 'pg' }),
    // Ids are UUIDs (gen_random_uuid()): the unit id is a UUID on the wire, and invitation ids in mailed links are unguessable.
    // The client's address as the app worked it out (TRUST_PROXY), not the first one a client wrote in X-Forwarded-For.
    advanced: { ...authSchemaOptions.advanced, ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] } },
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, token }) => {
        await mailer.send({ to: user.email, ...resetPasswordMail({ name: user.name, url: `${appUrl}/reset-password?token=${encodeURIComponent(token)}` }) });
      },
    },
    session: { expiresIn: 60 * 60 * 12, updateAge: 60 * 60 },
    // Failed sign-ins are limited per address in front of this (server/http/rate-limit.ts); better-auth's
    // own limiter (production only, all attempts counted) is a looser second fence, loose enough for a
    // unit's tablets signing in behind one address at the start of a list.
    rateLimit: { window: 60, max: 200, customRules: { '/sign-in/email': { window: 60, max: 30 } } },
    databaseHooks: {
      user: {
        create: {
          before: async (user, ctx) => {
            await refuseUninvited(db, user.email, Boolean(ctx?.request));
          },
        },
      },
      session: {
        create: {
          // A new session opens in the user's unit, so the organization plugin's endpoints have it.
          before: async (session) => {
            const unit = await firstMembership(db, session.userId);
            return { data: { ...session, activeOrganizationId: unit?.organizationId ?? null } };
          },
        },
      },
    },
    plugins: [
      unitPlugin(async ({ id, email, role, organization: unit, inviter }) => {
        const hospital = String((unit as { hospital?: unknown }).hospital ?? '');
        await mailer.send({ to: email, ...invitationMail({ url: `${appUrl}/invite/${id}`, unitName: unit.name, hospital, role: roleSchema.parse(role), inviterName: inviter.user.name }) });
      }),
    ],
    // Units are created by the seed or an operator; invitations go through POST /api/invitations,
    // which checks the role against Ledgerline's four.
    disabledPaths: ['/organization/create', '/organization/update', '/organization/delete', '/organization/invite-member'],
    telemetry: { enabled: false },
    ...(logger ? { logger: { level: 'info' as const, log: (level: 'debug' | 'info' | 'warn' | 'error', message: string, ...args: unknown[]) => logger[level]({ from: 'better-auth', args }, message) } } : {}),
  });
}

export type Auth = ReturnType<typeof createAuth>;
