import { z } from 'zod';
import { changePasswordSchema, newPasswordSchema } from '@shared/schemas/auth';

// The password forms' own checks (the two new passwords agree), in a module of their own that loads with the
// form's first check (see lazyResolver), so zod stays out of the pages' first load.

export const resetPasswordFormSchema = z
  .object({ password: newPasswordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' });
export type ResetPasswordFormValues = z.infer<typeof resetPasswordFormSchema>;

export const changePasswordFormSchema = changePasswordSchema
  .and(z.object({ repeat: z.string() }))
  .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'The two new passwords differ.' });
export type ChangePasswordFormValues = z.infer<typeof changePasswordFormSchema>;
