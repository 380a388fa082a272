import { CUT_PACK_ROLES_FOR_REQUESTER, type ExportView } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { downloadExportFile } from '../api/download-export-file';
import { useJobExports } from '../api/get-job-exports';

/** The newest finished export's assembly guides (an export still being prepared has no files yet). */
export function assemblyGuides(exports: readonly ExportView[] | undefined) {
  const done = exports?.find((e) => e.state === 'done');
  if (!done) return [];
  return done.files
    .filter((f) => CUT_PACK_ROLES_FOR_REQUESTER.includes(f.role))
    .map((file) => ({ exportId: done.id, file }));
}

/** The requester's own job: the assembly guide of its cut pack, to put the model together once cut. */
export function AssemblyGuidePanel({ jobId }: { jobId: string }) {
  const exports = useJobExports(jobId, true);
  const [downloadError, setDownloadError] = useState<unknown>(null);
  const guides = assemblyGuides(exports.data);
  return (
    <Paper variant="outlined" sx={{ p: 2, mt: 2 }} data-testid="assembly-guide">
      <Typography variant="h2" sx={{ mb: 1 }}>
        Assembly guide
      </Typography>
      {exports.error ? <FormErrorAlert error={exports.error} /> : null}
      {downloadError ? <FormErrorAlert error={downloadError} /> : null}
      {exports.isSuccess && guides.length === 0 ? (
        <Typography color="text.secondary">
          The assembly guide is offered here once the workshop has prepared the job&apos;s files.
        </Typography>
      ) : null}
      <Stack direction="row" spacing={1} sx={{ flexWrap: 'wrap' }} useFlexGap>
        {guides.map(({ exportId, file }) => (
          <Button
            key={file.name}
            variant="outlined"
            onClick={() => {
              setDownloadError(null);
              downloadExportFile(exportId, file.name).catch(setDownloadError);
            }}
          >
            {`Download ${file.name}`}
          </Button>
        ))}
      </Stack>
    </Paper>
  );
}
