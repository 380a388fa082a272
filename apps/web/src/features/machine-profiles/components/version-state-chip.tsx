import { type ProfileVersionState } from '@kerfwright/contracts';
import Chip from '@mui/material/Chip';
import { STATE_COLOURS, STATE_LABELS } from './profile-labels';

export function VersionStateChip({ state }: { state: ProfileVersionState }) {
  return (
    <Chip
      size="small"
      color={STATE_COLOURS[state]}
      variant={state === 'retired' ? 'outlined' : 'filled'}
      label={STATE_LABELS[state]}
      data-testid="version-state"
    />
  );
}
