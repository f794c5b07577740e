import { organizationClient } from 'better-auth/client/plugins';
import { createAuthClient } from 'better-auth/react';

/**
 * better-auth's browser client, on the same origin as the app (/api/auth/*). One organization is one
 * hospital unit; the organization plugin carries invitations and membership.
 */
export const authClient = createAuthClient({
  baseURL: typeof window === 'undefined' ? 'http://localhost' : window.location.origin,
  basePath: '/api/auth',
  plugins: [organizationClient()],
});
