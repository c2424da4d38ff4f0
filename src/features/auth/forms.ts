// Form-only schemas: the server's rules plus the repeated password, which never leaves the browser.
import { z } from 'zod';
import { newPassword, personName } from '../../../server/schemas/auth';

const samePassword = (v: { password: string; repeat: string }) => v.password === v.repeat;
const differ = { error: 'The two passwords differ.', path: ['repeat'] };

export const newPasswordForm = z
  .object({ password: newPassword, repeat: z.string() })
  .refine(samePassword, differ);

export const newAccountForm = z
  .object({ name: personName, password: newPassword, repeat: z.string() })
  .refine(samePassword, differ);
