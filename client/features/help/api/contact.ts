import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContactAnswer } from '@shared/schemas/help';
import { api } from '@client/lib/api-client';

/** The support address rarely changes: asked once per visit. */
const contactQuery = queryOptions({ queryKey: ['help', 'contact'] as const, queryFn: () => api.get<ContactAnswer>('/api/help/contact'), staleTime: Infinity });

export const useContact = () => useQuery(contactQuery);
