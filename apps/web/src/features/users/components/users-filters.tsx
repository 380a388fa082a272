import { ROLES } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import { useEffect, useState } from 'react';
import { ROLE_LABELS } from '../../../config/roles';
import { type StatusFilter, type UsersSearchChange } from '../hooks/use-users-search-params';

interface UsersFiltersProps {
  q: string;
  role: string;
  status: StatusFilter;
  onChange: (change: UsersSearchChange) => void;
}

const SEARCH_DELAY_MS = 300;

/** Search by name or e-mail, and narrow by role and status. */
export function UsersFilters({ q, role, status, onChange }: UsersFiltersProps) {
  const [text, setText] = useState(q);

  // Follow the address when it changes from outside (Back, a cleared filter).
  useEffect(() => setText(q), [q]);

  // Ask the API once typing pauses, not on every key.
  useEffect(() => {
    if (text === q) return;
    const timer = window.setTimeout(() => onChange({ q: text }), SEARCH_DELAY_MS);
    return () => window.clearTimeout(timer);
  }, [text, q, onChange]);

  return (
    <Box
      role="search"
      aria-label="Find people"
      sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr 1fr' }, mb: 2 }}
    >
      <TextField
        id="people-search"
        label="Search name or e-mail"
        type="search"
        value={text}
        onChange={(event) => setText(event.target.value)}
        slotProps={{ htmlInput: { maxLength: 100 } }}
        size="small"
      />
      <TextField
        id="people-role"
        select
        label="Role"
        value={role}
        onChange={(event) => onChange({ role: event.target.value })}
        size="small"
      >
        <MenuItem value="all">All roles</MenuItem>
        {ROLES.map((r) => (
          <MenuItem key={r} value={r}>
            {ROLE_LABELS[r]}
          </MenuItem>
        ))}
      </TextField>
      <TextField
        id="people-status"
        select
        label="Status"
        value={status}
        onChange={(event) => onChange({ status: event.target.value as StatusFilter })}
        size="small"
      >
        <MenuItem value="all">Everyone</MenuItem>
        <MenuItem value="active">Active</MenuItem>
        <MenuItem value="inactive">Deactivated</MenuItem>
      </TextField>
    </Box>
  );
}
