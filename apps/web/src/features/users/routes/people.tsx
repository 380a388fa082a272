import { type Role, type UserView } from '@kerfwright/contracts';
import { useState } from 'react';
import { DataTable } from '../../../components/data-table/data-table';
import { ListPage } from '../../../components/layouts/list-page';
import { ROLE_LABELS } from '../../../config/roles';
import { useUser } from '../../../lib/auth';
import { useUsers } from '../api/get-users';
import { type UpdateUserVariables, useUpdateUser } from '../api/update-user';
import { ConfirmChangeDialog, type PendingChange } from '../components/confirm-change-dialog';
import { UsersFilters } from '../components/users-filters';
import { userColumns } from '../components/users-table';
import { useUsersSearchParams } from '../hooks/use-users-search-params';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';

interface Pending extends PendingChange {
  variables: UpdateUserVariables;
  done: string;
}

/** Supervisors: everyone with an account, their roles and whether they may sign in. */
export function PeopleRoute() {
  const me = useUser();
  const { params, query, set, tableProps } = useUsersSearchParams();
  const users = useUsers(query);
  const updateUser = useUpdateUser();
  const [pending, setPending] = useState<Pending | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const askRole = (user: UserView, role: Role) => {
    if (role === user.role) return;
    updateUser.reset();
    setPending({
      title: `Make ${user.displayName} a ${ROLE_LABELS[role].toLowerCase()}?`,
      explanation:
        role === 'supervisor'
          ? `${user.displayName} will be able to do everything, including managing people and approving jobs.`
          : `${user.displayName} changes from ${ROLE_LABELS[user.role]} to ${ROLE_LABELS[role]} and will see the pages of that role from their next page load.`,
      confirmLabel: 'Change role',
      destructive: false,
      // Giving or taking a supervisor's rights (people, approvals, everything) is never one Enter too many.
      cancelFirst: role === 'supervisor' || user.role === 'supervisor',
      variables: { id: user.id, changes: { role } },
      done: `${user.displayName} is now a ${ROLE_LABELS[role].toLowerCase()}.`,
    });
  };

  const askActive = (user: UserView, active: boolean) => {
    updateUser.reset();
    setPending(
      active
        ? {
            title: `Reactivate ${user.displayName}?`,
            explanation: `${user.displayName} will be able to sign in again as a ${ROLE_LABELS[user.role].toLowerCase()}.`,
            confirmLabel: 'Reactivate',
            destructive: false,
            variables: { id: user.id, changes: { active: true } },
            done: `${user.displayName} can sign in again.`,
          }
        : {
            title: `Deactivate ${user.displayName}?`,
            explanation: `${user.displayName} will not be able to sign in until a supervisor reactivates the account. Their jobs and history stay.`,
            confirmLabel: 'Deactivate',
            destructive: true,
            variables: { id: user.id, changes: { active: false } },
            done: `${user.displayName} is deactivated.`,
          },
    );
  };

  const confirm = () => {
    if (!pending) return;
    updateUser.mutate(pending.variables, {
      onSuccess: () => {
        setNotice(pending.done);
        setPending(null);
      },
    });
  };

  return (
    <ListPage
      title="People"
      intro="Everyone with a Kerfwright account. Change a role or deactivate an account; every change is recorded."
      filters={<UsersFilters q={params.q ?? ''} role={params.role} status={params.status} onChange={set} />}
      query={users}
      errorTitle="The list of people could not be loaded"
      table={
        <DataTable
          label="People"
          columns={userColumns({ currentUserId: me.id, onRoleChange: askRole, onActiveChange: askActive })}
          rows={users.data?.items}
          rowKey={(user) => user.id}
          rowProps={(user) => ({ 'data-testid': `person-${user.email}` })}
          loadingRows={Math.min(params.pageSize, 5)}
          minWidth={760}
          emptyText="No one matches these filters."
          fetching={users.isFetching}
          fetchingLabel="Loading people"
          total={users.data?.total ?? 0}
          {...tableProps}
        />
      }
    >
      <ConfirmChangeDialog
        change={pending}
        busy={updateUser.isPending}
        error={updateUser.error}
        onConfirm={confirm}
        onCancel={() => setPending(null)}
      />
      <NoticeSnackbar notice={notice} onClose={() => setNotice(null)} />
    </ListPage>
  );
}
