/** Form rules in the browser; the server checks the same rules again (src/lib/server/accounts.ts). */
import { z } from 'zod';

export const email = z.string().trim().min(1, 'Enter your e-mail address.').email('Enter an e-mail address such as name@example.org.');
export const newPassword = z.string().min(10, 'Use at least 10 characters.').max(256, 'Use at most 256 characters.');

export const signInForm = z.object({ email, password: z.string().min(1, 'Enter your password.') });
export const signUpForm = z.object({ name: z.string().trim().min(1, 'Enter your name.').max(100), email, password: newPassword });
export const resetRequestForm = z.object({ email });
export const resetConfirmForm = z
  .object({ password: newPassword, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' });
export const profileForm = z.object({ name: z.string().trim().min(1, 'Enter your name.').max(100) });
export const passwordForm = z
  .object({ currentPassword: z.string().min(1, 'Enter your current password.'), newPassword, repeat: z.string() })
  .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' });
