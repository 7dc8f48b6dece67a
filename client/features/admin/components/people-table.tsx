import { useDeferredValue, useState } from 'react';
import { toast } from '@client/lib/toast';
import type { Role } from '@shared/schemas/auth';
import { Badge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { formatDate } from '@client/lib/dates';
import { useAdminUsers, useReinstateUser, type AdminUserRow } from '../api/admin-users';
import { SuspendUserDialog } from './suspend-user-dialog';


function ReinstateButton({ user }: { user: AdminUserRow }) {
  const reinstate = useReinstateUser({
    mutationConfig: {
      onSuccess: (updated) => toast.success(`${updated.displayName} can sign in again.`),
      onError: (error) => toast.error(error.message),
    },
  });
  return (
    <Button variant="secondary" className="whitespace-nowrap text-sm" busy={reinstate.isPending} onClick={() => reinstate.mutate({ userId: user.id })}>
      Reinstate<span className="sr-only"> {user.displayName}</span>
    </Button>
  );
}

/** Every account, searchable; an administrator may suspend or reinstate anyone but themselves. */
export function PeopleTable({ currentUserId }: { currentUserId?: string }) {
  const [suspending, setSuspending] = useState<AdminUserRow | null>(null);
  const [q, setQ] = useState('');
  const [role, setRole] = useState<Role | ''>('');
  const filters = { q: useDeferredValue(q.trim()) || undefined, role: role || undefined };
  const users = useAdminUsers(filters);
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-1 flex-col gap-1 text-sm font-semibold">
          Search by name or e-mail
          <input
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            className="min-h-11 rounded-lg border border-slate-300 bg-white px-3 text-base font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Role
          <select
            value={role}
            onChange={(e) => setRole(e.target.value as Role | '')}
            className="min-h-11 rounded-lg border border-slate-300 bg-white px-3 text-base font-normal"
          >
            <option value="">All</option>
            <option value="builder">Builders</option>
            <option value="shop">Shops</option>
            <option value="admin">Administrators</option>
          </select>
        </label>
      </div>
      {users.isError && (
        <Notice tone="error" title="The people could not be loaded" onRetry={() => void users.refetch()}>
          {users.error.message}
        </Notice>
      )}
      {users.data && (
        <>
          <p className="text-sm text-ink-soft" aria-live="polite">
            {users.data.total} {users.data.total === 1 ? 'account' : 'accounts'}
          </p>
          <div className="relative overflow-x-auto">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Accounts</caption>
              <thead className="border-b border-slate-200 text-ink-soft">
                <tr>
                  <th scope="col" className="py-2 pr-4">Name</th>
                  <th scope="col" className="py-2 pr-4">E-mail</th>
                  <th scope="col" className="py-2 pr-4">Role</th>
                  <th scope="col" className="py-2 pr-4">Status</th>
                  <th scope="col" className="py-2 pr-4">Joined</th>
                  <th scope="col" className="py-2">
                    <span className="sr-only">Suspend or reinstate</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {users.data.users.map((user) => (
                  <tr key={user.id} className="border-b border-slate-100">
                    <td className="py-2 pr-4 font-semibold">{user.displayName}</td>
                    <td className="py-2 pr-4">{user.email}</td>
                    <td className="py-2 pr-4 capitalize">{user.role}</td>
                    <td className="py-2 pr-4">{user.status === 'active' ? 'Active' : <Badge tone="error">Suspended</Badge>}</td>
                    <td className="py-2 pr-4">{formatDate(user.createdAt)}</td>
                    <td className="py-2 text-right">
                      {currentUserId === undefined ? null : user.id === currentUserId ? (
                        <span className="text-ink-soft">You</span>
                      ) : user.status === 'active' ? (
                        <Button variant="secondary" className="whitespace-nowrap text-sm" onClick={() => setSuspending(user)}>
                          Suspend<span className="sr-only"> {user.displayName}</span>
                        </Button>
                      ) : (
                        <ReinstateButton user={user} />
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
      <SuspendUserDialog user={suspending} onClose={() => setSuspending(null)} />
    </div>
  );
}
