import { type JobView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { type LengthUnit } from '../../../lib/units';
import { SheetLayoutView } from '../../layout/components/sheet-layout-view';
import { useJobLayout } from '../hooks/use-job-layout';

/** The prepared job's sheets with their pieces, utilisation and the preparation's estimates. */
export function JobSheetsPanel({ job, unit }: { job: JobView; unit: LengthUnit }) {
  const layout = useJobLayout(job, true);
  return (
    <Paper variant="outlined" sx={{ p: 2, mt: 2 }} data-testid="job-sheets">
      <Typography variant="h2" sx={{ mb: 1 }}>
        Sheets
      </Typography>
      {layout.error ? <FormErrorAlert error={layout.error} /> : null}
      {layout.loading && !layout.value ? <LinearProgress aria-label="Laying out the sheets" /> : null}
      {layout.value?.mismatch ? (
        <Alert severity="warning" sx={{ mb: 1 }}>
          {layout.value.mismatch}
        </Alert>
      ) : null}
      {layout.value ? (
        <SheetLayoutView sheets={layout.value.sheets} unit={unit} estimate={layout.value.estimate} />
      ) : null}
      {layout.value && layout.value.estimate && !job.preparation?.estimate ? (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
          Time and cost from the machine profile version and the stock sheet price, without label marking; the
          cut pack&apos;s setup sheet has the full estimate.
        </Typography>
      ) : null}
    </Paper>
  );
}
