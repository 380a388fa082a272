import { type HealthView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Chip from '@mui/material/Chip';
import Skeleton from '@mui/material/Skeleton';
import Typography from '@mui/material/Typography';
import { errorMessage } from '../../../lib/api-client';
import { useHealth } from '../api/get-health';

function StatusRow({
  label,
  up,
  upText,
  downText,
}: {
  label: string;
  up: boolean;
  upText: string;
  downText: string;
}) {
  return (
    <Box
      component="li"
      sx={{ display: 'flex', justifyContent: 'space-between', alignItems: 'center', py: 0.75 }}
    >
      <Typography component="span">{label}</Typography>
      <Chip
        size="small"
        label={up ? upText : downText}
        color={up ? 'success' : 'error'}
        variant={up ? 'outlined' : 'filled'}
      />
    </Box>
  );
}

function HealthDetails({ health }: { health: HealthView }) {
  return (
    <>
      {health.status === 'ok' ? (
        <Alert severity="success" sx={{ mb: 1.5 }}>
          Kerfwright is running normally.
        </Alert>
      ) : (
        <Alert severity="warning" sx={{ mb: 1.5 }}>
          Part of the service is down: some work may wait until it is back.
        </Alert>
      )}
      <Box component="ul" sx={{ listStyle: 'none', p: 0, m: 0 }}>
        <StatusRow label="Database" up={health.database === 'up'} upText="Up" downText="Down" />
        <StatusRow label="Job queue" up={health.redis === 'up'} upText="Up" downText="Down" />
      </Box>
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        Version {health.version}
      </Typography>
    </>
  );
}

/** GET /api/health, refreshed every half minute. */
export function HealthCard() {
  const health = useHealth();
  return (
    <Card component="section" aria-labelledby="health-heading" data-testid="service-health">
      <CardContent>
        <Typography id="health-heading" variant="h2" gutterBottom>
          Service health
        </Typography>
        {health.isPending ? (
          <Box role="status" aria-label="Checking service health">
            <Skeleton height={48} />
            <Skeleton />
            <Skeleton />
          </Box>
        ) : health.isError ? (
          <Alert
            severity="error"
            action={
              <Button color="inherit" size="small" onClick={() => void health.refetch()}>
                Check again
              </Button>
            }
          >
            Health could not be checked: {errorMessage(health.error)}
          </Alert>
        ) : (
          <HealthDetails health={health.data} />
        )}
      </CardContent>
    </Card>
  );
}
