import { type ExportView } from '@kerfwright/contracts';
import LinearProgress from '@mui/material/LinearProgress';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useFollowExport } from '../../jobs/api/follow-export';
import { packFailureText, packProgressText } from '../../jobs/lib/pack-text';

/** A cut pack's state in a desk row: a live progress bar while it is prepared (followed by its events). */
export function PackProgress({
  jobId,
  newest,
  lastBuiltFiles = null,
}: {
  jobId: string;
  newest: ExportView | null | undefined;
  /** Files of the last pack built, still offered when a newer one failed. */
  lastBuiltFiles?: number | null;
}) {
  const busy = newest && (newest.state === 'queued' || newest.state === 'running');
  const live = useFollowExport(busy ? newest.id : null, jobId);
  const view = live.view ?? newest;
  if (view === undefined) return <Typography variant="body2">…</Typography>;
  if (view === null) return <Typography variant="body2">No cut pack yet</Typography>;
  if (view.state === 'done' && view.safetyChanged)
    return (
      <Typography variant="body2" color="warning.main">
        {`Ready, ${view.files.length} files; setup sheet out of date (safety notices changed)`}
      </Typography>
    );
  if (view.state === 'done')
    return <Typography variant="body2">{`Ready, ${view.files.length} files`}</Typography>;
  if (view.state === 'failed') {
    // A row says how things stand; why the rebuild failed is said in full on the opened job.
    return lastBuiltFiles !== null ? (
      <Typography variant="body2" color="warning.main" title={packFailureText(view)}>
        {`Ready, ${lastBuiltFiles} files; a newer pack failed`}
      </Typography>
    ) : (
      <Typography variant="body2" color="error" title={packFailureText(view)}>
        Failed: open the job for why
      </Typography>
    );
  }
  return (
    <Stack spacing={0.5} sx={{ minWidth: 160 }}>
      <Typography variant="body2">{`Preparing (${packProgressText(view)})`}</Typography>
      <LinearProgress
        variant="determinate"
        value={view.progress}
        aria-label={`Preparing the cut pack, ${view.progress} %`}
      />
    </Stack>
  );
}
