import { ROLES, type Role } from '@kerfwright/contracts';
import { labelled, SearchSelectFilterBar } from '../../../components/data-table/filter-bar';
import { ROLE_LABELS } from '../../../config/roles';
import { type StatusFilter } from '../hooks/use-users-search-params';

interface UsersFiltersProps {
  q: string;
  role: Role | undefined;
  status: StatusFilter | undefined;
  onChange: (change: { q?: string; role?: Role; status?: StatusFilter }) => void;
}

const SELECTS = {
  role: { id: 'people-role', label: 'Role', allLabel: 'All roles', options: labelled(ROLES, ROLE_LABELS) },
  status: {
    id: 'people-status',
    label: 'Status',
    allLabel: 'Everyone',
    options: [
      { value: 'active', label: 'Active' },
      { value: 'inactive', label: 'Deactivated' },
    ],
  },
} as const;

/** Search by name or e-mail, and narrow by role and status. */
export function UsersFilters({ onChange, ...values }: UsersFiltersProps) {
  return (
    <SearchSelectFilterBar
      label="Find people"
      search={{ id: 'people-search', label: 'Search name or e-mail' }}
      selects={SELECTS}
      values={values}
      onChange={onChange}
    />
  );
}
