import { type Role, type UserView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Snackbar from '@mui/material/Snackbar';
import TablePagination from '@mui/material/TablePagination';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { ROLE_LABELS } from '../../../config/roles';
import { useUser } from '../../../lib/auth';
import { useUsers } from '../api/get-users';
import { type UpdateUserVariables, useUpdateUser } from '../api/update-user';
import { ConfirmChangeDialog, type PendingChange } from '../components/confirm-change-dialog';
import { UsersFilters } from '../components/users-filters';
import { UsersTable } from '../components/users-table';
import { PAGE_SIZES, useUsersSearchParams } from '../hooks/use-users-search-params';

interface Pending extends PendingChange {
  variables: UpdateUserVariables;
  done: string;
}

/** Supervisors: everyone with an account, their roles and whether they may sign in. */
export function PeopleRoute() {
  const me = useUser();
  const { params, status, update } = useUsersSearchParams();
  const users = useUsers(params);
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

  const total = users.data?.total ?? 0;
  // A page past the end (a stale link, or the last row filtered away) shows the last page instead.
  const pageIndex = Math.min(params.page - 1, Math.max(0, Math.ceil(total / params.pageSize) - 1));

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
    <Box sx={{ maxWidth: 1200 }}>
      <title>People · Kerfwright</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        People
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        Everyone with a Kerfwright account. Change a role or deactivate an account; every change is recorded.
      </Typography>

      <UsersFilters q={params.q ?? ''} role={params.role ?? 'all'} status={status} onChange={update} />

      {users.isError ? (
        <ErrorPanel
          title="The list of people could not be loaded"
          error={users.error}
          onRetry={() => void users.refetch()}
        />
      ) : (
        <Paper variant="outlined" sx={{ position: 'relative' }}>
          <Box sx={{ height: 4 }}>
            {users.isFetching ? <LinearProgress aria-label="Loading people" /> : null}
          </Box>
          <UsersTable
            users={users.data?.items}
            loadingRows={Math.min(params.pageSize, 5)}
            sort={params.sort}
            currentUserId={me.id}
            onSort={(sort) => update({ sort })}
            onRoleChange={askRole}
            onActiveChange={askActive}
          />
          <TablePagination
            component="div"
            count={total}
            page={pageIndex}
            rowsPerPage={params.pageSize}
            rowsPerPageOptions={[...PAGE_SIZES]}
            labelRowsPerPage="Rows per page"
            onPageChange={(_, page) => update({ page: page + 1 })}
            onRowsPerPageChange={(event) => update({ pageSize: Number(event.target.value) })}
          />
        </Paper>
      )}

      <ConfirmChangeDialog
        change={pending}
        busy={updateUser.isPending}
        error={updateUser.error}
        onConfirm={confirm}
        onCancel={() => setPending(null)}
      />
      <Snackbar
        open={notice !== null}
        autoHideDuration={5000}
        onClose={() => setNotice(null)}
        message={notice}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      />
    </Box>
  );
}
