import { useState } from 'react';
import { organisationKindOf } from '@emberline/contracts/permissions';
import { roleLabels, roles, type Role } from '@emberline/contracts/roles';
import type { User } from '@emberline/contracts/users';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { Pager } from '../../../components/ui/pager';
import { formatDateTime } from '../../../lib/format';
import { useEndSessions, useResendInvitation, useUpdateUser, useUsers } from '../api/users';

const statusStyles: Record<User['status'], string> = {
  active: 'bg-emerald-100 text-emerald-900',
  invited: 'bg-sky-100 text-sky-900',
  disabled: 'bg-soot-200 text-soot-700',
};

const USERS_PAGE_SIZE = 50;

export function UsersTable({ currentUserId }: { currentUserId: string }) {
  const [page, setPage] = useState(1);
  const users = useUsers(page, USERS_PAGE_SIZE);
  const update = useUpdateUser();
  const endSessions = useEndSessions();
  const resend = useResendInvitation();
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);

  const report = (text: string) => () => setMessage({ tone: 'success', text });
  const fail = (error: Error) => setMessage({ tone: 'error', text: error.message });

  if (users.isPending) return <LoadingLine />;
  if (users.error) return <Notice tone="error">{users.error.message}</Notice>;

  return (
    <div className="flex flex-col gap-3">
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Users</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="py-2 pr-4">
                Name
              </th>
              <th scope="col" className="py-2 pr-4">
                Role
              </th>
              <th scope="col" className="py-2 pr-4">
                Organisation
              </th>
              <th scope="col" className="py-2 pr-4">
                Status
              </th>
              <th scope="col" className="py-2 pr-4">
                Sessions
              </th>
              <th scope="col" className="py-2 pr-4">
                Last sign-in
              </th>
              <th scope="col" className="py-2">
                Actions
              </th>
            </tr>
          </thead>
          <tbody>
            {users.data.items.map((user) => {
              const self = user.id === currentUserId;
              return (
                <tr
                  key={user.id}
                  className="border-b border-soot-100 align-top"
                  data-testid={`user-row-${user.email}`}
                >
                  <td className="py-3 pr-4">
                    <p className="font-medium">
                      {user.name}
                      {self ? <span className="text-soot-500"> (you)</span> : null}
                    </p>
                    <p className="text-soot-600">{user.email}</p>
                  </td>
                  <td className="py-3 pr-4">
                    <label className="sr-only" htmlFor={`role-${user.id}`}>
                      Role of {user.name}
                    </label>
                    <select
                      id={`role-${user.id}`}
                      value={user.role}
                      disabled={self || update.isPending}
                      onChange={(event) =>
                        update.mutate(
                          { id: user.id, changes: { role: event.target.value as Role } },
                          {
                            onSuccess: report(
                              `${user.name} is now ${roleLabels[event.target.value as Role].toLowerCase()}.`,
                            ),
                            onError: fail,
                          },
                        )
                      }
                      className="rounded-md border border-soot-300 bg-white px-2 py-1"
                    >
                      {roles
                        .filter(
                          (role) => organisationKindOf(role) === organisationKindOf(user.role),
                        )
                        .map((role) => (
                          <option key={role} value={role}>
                            {roleLabels[role]}
                          </option>
                        ))}
                    </select>
                  </td>
                  <td className="py-3 pr-4">{user.organisationName}</td>
                  <td className="py-3 pr-4">
                    <span
                      className={`rounded-full px-2 py-0.5 text-xs font-medium ${statusStyles[user.status]}`}
                    >
                      {user.status}
                    </span>
                  </td>
                  <td className="py-3 pr-4 font-mono">{user.activeSessions}</td>
                  <td className="py-3 pr-4 text-soot-700">
                    {user.lastSignInAt ? formatDateTime(user.lastSignInAt) : 'Never'}
                  </td>
                  <td className="py-3">
                    <div className="flex flex-wrap gap-2">
                      {user.status === 'invited' ? (
                        <Button
                          variant="secondary"
                          onClick={() =>
                            resend.mutate(user.id, {
                              onSuccess: () =>
                                setMessage({
                                  tone: 'success',
                                  text: `A new invitation is on its way to ${user.email}; the Outbox shows its delivery.`,
                                }),
                              onError: fail,
                            })
                          }
                        >
                          Resend invitation
                        </Button>
                      ) : null}
                      <Button
                        variant="secondary"
                        disabled={user.activeSessions === 0}
                        onClick={() =>
                          endSessions.mutate(user.id, {
                            onSuccess: ({ ended }) =>
                              setMessage({
                                tone: 'success',
                                text: `Ended ${ended} session${ended === 1 ? '' : 's'} of ${user.name}.`,
                              }),
                            onError: fail,
                          })
                        }
                      >
                        End sessions
                      </Button>
                      {!self ? (
                        <Button
                          variant={user.status === 'disabled' ? 'secondary' : 'danger'}
                          onClick={() => {
                            const disabled = user.status !== 'disabled';
                            update.mutate(
                              { id: user.id, changes: { disabled } },
                              {
                                onSuccess: report(
                                  disabled
                                    ? `${user.name} is disabled and signed out everywhere.`
                                    : `${user.name} may sign in again.`,
                                ),
                                onError: fail,
                              },
                            );
                          }}
                        >
                          {user.status === 'disabled' ? 'Enable' : 'Disable'}
                        </Button>
                      ) : null}
                    </div>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <Pager
        page={page}
        pageSize={USERS_PAGE_SIZE}
        total={users.data.total}
        noun={['user', 'users']}
        onPage={setPage}
      />
    </div>
  );
}
