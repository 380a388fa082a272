import { type JobState } from '@kerfwright/contracts';
import Chip from '@mui/material/Chip';

const COLOUR: Record<
  JobState,
  'default' | 'primary' | 'secondary' | 'success' | 'warning' | 'error' | 'info'
> = {
  draft: 'default',
  requested: 'info',
  prepared: 'primary',
  approved: 'secondary',
  released: 'warning',
  cut: 'success',
  closed: 'default',
  returned: 'error',
};

export function JobStateChip({ state }: { state: JobState }) {
  return <Chip size="small" color={COLOUR[state]} label={state} data-testid="job-state" />;
}
