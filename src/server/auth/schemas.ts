/** Request bodies of the auth and people endpoints. */
import { z } from 'zod';
import { ROLES } from './types.ts';
import { PASSWORD_MAX_CHARS } from './password-rules.ts';

const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, { error: 'at most 254 characters' })
  .pipe(z.email({ error: 'not an e-mail address' }));
/** Long enough for any allowed password, short enough that hashing cannot be used to tie up the server. */
const anyPassword = z
  .string()
  .min(1, { error: 'required' })
  .max(PASSWORD_MAX_CHARS * 4, { error: 'too long' });
const token = z.string().min(1, { error: 'required' }).max(200);

export const signInBody = z.object({ email, password: anyPassword });
export const resetRequestBody = z.object({ email });
export const tokenPasswordBody = z.object({ token, password: anyPassword });
export const passwordChangeBody = z.object({ currentPassword: anyPassword, newPassword: anyPassword });

const roles = z.array(z.enum(ROLES)).min(1, { error: 'choose at least one role' }).max(ROLES.length);
export const inviteBody = z.object({
  email,
  name: z.string().trim().min(1, { error: 'required' }).max(120, { error: 'at most 120 characters' }),
  roles,
});
export const rolesBody = z.object({ roles });
export const emptyBody = z.object({}).strict();
