import { useQuery } from '@tanstack/react-query';
import { authQueries } from './auth-keys';

export function useMe() {
  return useQuery(authQueries.me());
}
