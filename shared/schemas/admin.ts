import { z } from 'zod';
import { roles } from './auth';

export const createAdminSchema = z.object({
  displayName: z.string({ error: 'Enter the person’s name.' }).trim().min(1, 'Enter the person’s name.').max(80, 'Use at most 80 characters.'),
  email: z
    .string({ error: 'Enter an e-mail address.' })
    .trim()
    .max(254, 'That e-mail address is too long.')
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
});
export type CreateAdminInput = z.infer<typeof createAdminSchema>;

export const userSearchSchema = z.object({
  q: z.string().trim().max(100, 'Use at most 100 characters.').optional(),
  role: z.enum(roles, { error: 'Choose builder, shop or admin.' }).optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int().min(1).max(100).default(50),
  offset: z.coerce.number({ error: 'Give a whole number.' }).int().min(0).default(0),
});
export type UserSearchInput = z.infer<typeof userSearchSchema>;
