import { z } from 'zod';

/** How to reach Tenthmark's people: the address that takes e-mail from anyone, signed in or not (SUPPORT_EMAIL). */
export const contactAnswerSchema = z.object({ email: z.email() });
export type ContactAnswer = z.infer<typeof contactAnswerSchema>;
