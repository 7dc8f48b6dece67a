import type { ReactNode } from 'react';
import { Navigate, useLocation, useSearchParams } from 'react-router-dom';
import { safeReturnPath } from '@shared/paths';
import type { Role } from '@shared/schemas/auth';
import { Notice } from '@client/components/ui/notice';
import { useMe } from '@client/features/auth';

/** Signed-out visitors go to sign-in (and come back); the wrong role sees why it cannot enter. */
export function RequireRole({ roles, children }: { roles?: Role[]; children: ReactNode }) {
  const { data: me, isPending } = useMe();
  const location = useLocation();
  if (isPending) return <p className="text-ink-soft">Loading …</p>;
  if (!me) return <Navigate to={`/signin?returnTo=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  if (roles && !roles.includes(me.role)) {
    return <Notice tone="error" title="Not for your account">This page is for {roles.join(' and ')} accounts.</Notice>;
  }
  return children;
}

/** Pages for signed-out visitors only (sign in, sign up) send signed-in people on, to where they were going. */
export function GuestOnly({ children }: { children: ReactNode }) {
  const { data: me, isPending } = useMe();
  const [params] = useSearchParams();
  if (isPending) return null;
  if (me) return <Navigate to={safeReturnPath(params.get('returnTo'))} replace />;
  return children;
}
