/** better-auth's browser client with the shop (organization) plugin and our roles. */
import { createAuthClient } from 'better-auth/react';
import { organizationClient } from 'better-auth/client/plugins';
import { ac, roles } from './access';

export const authClient = createAuthClient({ plugins: [organizationClient({ ac, roles })] });
