import { z } from 'zod';

// The extra-work form's checks, loaded with its first check (client/lib/lazy-resolver.ts) so zod stays out of the job page's first load.
export const changeOrderFormSchema = z.object({
  description: z.string().trim().min(4, 'Describe the extra work.').max(1000, 'Use at most 1,000 characters.'),
  dollars: z.string().trim().regex(/^\d{1,7}(\.\d{1,2})?$/, 'Give a price in dollars, like 180 or 180.50.'),
});
export type ChangeOrderFormValues = z.infer<typeof changeOrderFormSchema>;
