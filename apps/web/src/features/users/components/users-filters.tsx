import { ROLES, type Role } from '@kerfwright/contracts';
import { FilterBar, labelled, SearchFilter, SelectFilter } from '../../../components/data-table/filter-bar';
import { ROLE_LABELS } from '../../../config/roles';
import { type StatusFilter } from '../hooks/use-users-search-params';

interface UsersFiltersProps {
  q: string;
  role: Role | undefined;
  status: StatusFilter | undefined;
  onChange: (change: { q?: string; role?: Role; status?: StatusFilter }) => void;
}

const ROLE_OPTIONS = labelled(ROLES, ROLE_LABELS);
const STATUS_OPTIONS = [
  { value: 'active', label: 'Active' },
  { value: 'inactive', label: 'Deactivated' },
] as const;

/** Search by name or e-mail, and narrow by role and status. */
export function UsersFilters({ q, role, status, onChange }: UsersFiltersProps) {
  return (
    <FilterBar label="Find people" columns="2fr 1fr 1fr">
      <SearchFilter
        id="people-search"
        label="Search name or e-mail"
        value={q}
        onSearch={(text) => onChange({ q: text })}
      />
      <SelectFilter
        id="people-role"
        label="Role"
        allLabel="All roles"
        value={role}
        options={ROLE_OPTIONS}
        onChange={(value) => onChange({ role: value })}
      />
      <SelectFilter
        id="people-status"
        label="Status"
        allLabel="Everyone"
        value={status}
        options={STATUS_OPTIONS}
        onChange={(value) => onChange({ status: value })}
      />
    </FilterBar>
  );
}
