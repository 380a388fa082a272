import { ROLES, type Role, type UserView } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { type DataTableColumn } from '../../../components/data-table/data-table';
import { PhoneOnly } from '../../../components/ui/phone-only';
import { ROLE_LABELS } from '../../../config/roles';
import { type UserSortField } from '../api/get-users';
import { formatDate } from '../../../lib/dates';

interface UserColumnsOptions {
  currentUserId: string;
  onRoleChange: (user: UserView, role: Role) => void;
  onActiveChange: (user: UserView, active: boolean) => void;
}

/** One row per person: role and status can be changed here, except on your own account. */
export function userColumns({
  currentUserId,
  onRoleChange,
  onActiveChange,
}: UserColumnsOptions): DataTableColumn<UserView, UserSortField>[] {
  return [
    {
      id: 'name',
      header: 'Name',
      sortField: 'displayName',
      render: (user) => (
        <>
          {user.displayName}
          {user.id === currentUserId ? (
            <Typography component="span" color="text.secondary" sx={{ fontSize: 'inherit' }}>
              {' '}
              (you)
            </Typography>
          ) : null}
          {/* On a phone the Status column goes: a deactivated account says so under its name. */}
          {user.active ? null : <PhoneOnly>Deactivated</PhoneOnly>}
        </>
      ),
    },
    {
      id: 'email',
      hideOnPhone: true,
      header: 'E-mail',
      sortField: 'email',
      cellSx: { overflowWrap: 'anywhere' },
      render: (user) => user.email,
    },
    {
      id: 'role',
      header: 'Role',
      sortField: 'role',
      cellSx: { minWidth: { xs: 112, sm: 150 } },
      render: (user) => (
        <TextField
          select
          size="small"
          value={user.role}
          disabled={user.id === currentUserId}
          onChange={(event) => onRoleChange(user, event.target.value as Role)}
          slotProps={{ htmlInput: { 'aria-label': `Role of ${user.displayName}` } }}
          sx={{ minWidth: { xs: 104, sm: 140 } }}
        >
          {ROLES.map((r) => (
            <MenuItem key={r} value={r}>
              {ROLE_LABELS[r]}
            </MenuItem>
          ))}
        </TextField>
      ),
    },
    {
      id: 'since',
      hideOnTablet: true,
      header: 'Member since',
      sortField: 'createdAt',
      cellSx: { whiteSpace: 'nowrap' },
      render: (user) => formatDate(user.createdAt),
    },
    {
      id: 'status',
      hideOnPhone: true,
      header: 'Status',
      render: (user) => (
        <Chip
          size="small"
          label={user.active ? 'Active' : 'Deactivated'}
          color={user.active ? 'success' : 'default'}
          variant="outlined"
        />
      ),
    },
    {
      id: 'access',
      header: 'Access',
      align: 'right',
      // Narrower padding on a phone keeps the button inside the card.
      cellSx: { px: { xs: 1, sm: 2 } },
      render: (user) => (
        <Button
          size="small"
          variant="outlined"
          color={user.active ? 'error' : 'primary'}
          disabled={user.id === currentUserId}
          onClick={() => onActiveChange(user, !user.active)}
          aria-label={`${user.active ? 'Deactivate' : 'Reactivate'} ${user.displayName}`}
          sx={{ whiteSpace: 'nowrap' }}
        >
          {user.active ? 'Deactivate' : 'Reactivate'}
        </Button>
      ),
    },
  ];
}
