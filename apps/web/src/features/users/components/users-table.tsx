import { ROLES, type Role, type UserView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import MenuItem from '@mui/material/MenuItem';
import Skeleton from '@mui/material/Skeleton';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TableSortLabel from '@mui/material/TableSortLabel';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { ROLE_LABELS } from '../../../config/roles';
import { type UserSort, type UserSortField } from '../api/get-users';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

const COLUMNS: { field: UserSortField; label: string }[] = [
  { field: 'displayName', label: 'Name' },
  { field: 'email', label: 'E-mail' },
  { field: 'role', label: 'Role' },
  { field: 'createdAt', label: 'Member since' },
];

interface UsersTableProps {
  users: UserView[] | undefined;
  /** Rows to sketch while the first page loads. */
  loadingRows: number;
  sort: UserSort;
  currentUserId: string;
  onSort: (sort: UserSort) => void;
  onRoleChange: (user: UserView, role: Role) => void;
  onActiveChange: (user: UserView, active: boolean) => void;
}

function nextSort(current: UserSort, field: UserSortField): UserSort {
  if (current === field) return `-${field}`;
  return field;
}

/** One row per person: role and status can be changed here, except on your own account. */
export function UsersTable({
  users,
  loadingRows,
  sort,
  currentUserId,
  onSort,
  onRoleChange,
  onActiveChange,
}: UsersTableProps) {
  const desc = sort.startsWith('-');
  const sortField = (desc ? sort.slice(1) : sort) as UserSortField;

  return (
    <TableContainer sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label="People" sx={{ minWidth: 760 }}>
        <TableHead>
          <TableRow>
            {COLUMNS.map((column) => (
              <TableCell
                key={column.field}
                sortDirection={sortField === column.field ? (desc ? 'desc' : 'asc') : false}
              >
                <TableSortLabel
                  active={sortField === column.field}
                  direction={sortField === column.field && desc ? 'desc' : 'asc'}
                  onClick={() => onSort(nextSort(sort, column.field))}
                >
                  {column.label}
                </TableSortLabel>
              </TableCell>
            ))}
            <TableCell>Status</TableCell>
            <TableCell align="right">Access</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {users === undefined
            ? Array.from({ length: loadingRows }, (_, i) => (
                <TableRow key={`loading-${i}`} aria-hidden="true">
                  {Array.from({ length: 6 }, (__, j) => (
                    <TableCell key={j}>
                      <Skeleton />
                    </TableCell>
                  ))}
                </TableRow>
              ))
            : users.map((user) => {
                const self = user.id === currentUserId;
                return (
                  <TableRow key={user.id} hover data-testid={`person-${user.email}`}>
                    <TableCell>
                      {user.displayName}
                      {self ? (
                        <Typography component="span" color="text.secondary" sx={{ fontSize: 'inherit' }}>
                          {' '}
                          (you)
                        </Typography>
                      ) : null}
                    </TableCell>
                    <TableCell sx={{ overflowWrap: 'anywhere' }}>{user.email}</TableCell>
                    <TableCell sx={{ minWidth: 150 }}>
                      <TextField
                        select
                        size="small"
                        value={user.role}
                        disabled={self}
                        onChange={(event) => onRoleChange(user, event.target.value as Role)}
                        slotProps={{ htmlInput: { 'aria-label': `Role of ${user.displayName}` } }}
                        sx={{ minWidth: 140 }}
                      >
                        {ROLES.map((r) => (
                          <MenuItem key={r} value={r}>
                            {ROLE_LABELS[r]}
                          </MenuItem>
                        ))}
                      </TextField>
                    </TableCell>
                    <TableCell sx={{ whiteSpace: 'nowrap' }}>
                      {dateFormat.format(new Date(user.createdAt))}
                    </TableCell>
                    <TableCell>
                      <Chip
                        size="small"
                        label={user.active ? 'Active' : 'Deactivated'}
                        color={user.active ? 'success' : 'default'}
                        variant="outlined"
                      />
                    </TableCell>
                    <TableCell align="right">
                      <Button
                        size="small"
                        variant="outlined"
                        color={user.active ? 'error' : 'primary'}
                        disabled={self}
                        onClick={() => onActiveChange(user, !user.active)}
                        aria-label={`${user.active ? 'Deactivate' : 'Reactivate'} ${user.displayName}`}
                        sx={{ whiteSpace: 'nowrap' }}
                      >
                        {user.active ? 'Deactivate' : 'Reactivate'}
                      </Button>
                    </TableCell>
                  </TableRow>
                );
              })}
        </TableBody>
      </Table>
      {users !== undefined && users.length === 0 ? (
        <Box sx={{ py: 4, textAlign: 'center' }}>
          <Typography>No one matches these filters.</Typography>
        </Box>
      ) : null}
    </TableContainer>
  );
}
