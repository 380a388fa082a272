import { CUT_PACK_ROLES_PRINTING_SAFETY } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { Fragment, type ReactNode, useState } from 'react';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { useFollowExport } from '../api/follow-export';
import { downloadExportFile } from '../api/download-export-file';
import { useJobExports } from '../api/get-job-exports';
import { jobsKeys } from '../api/jobs-keys';
import { isApiError } from '../../../lib/api-client';
import { useJobSafety } from '../api/get-job-safety';
import { useRequestCutPack } from '../api/request-cut-pack';
import {
  NO_PACK_FOR_NEW_PREPARATION,
  PACK_FILE_ROLE_LABELS,
  packFailureText,
  packProgressText,
} from '../lib/pack-text';
import { formatDateTime } from '../../../lib/dates';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(2)} MB`;
}

/**
 * The job's cut pack for staff: prepare it (progress while the queue works), then its files with sizes. Files
 * are offered only once the caller has acknowledged the job's current safety notices and local rules. Only the
 * packs of the job's preparation in effect are listed (the API leaves out those of a preparation replaced since
 * the job was returned), so a job prepared again offers nothing until its new pack is built, and says so.
 */
export function CutPackPanel({
  jobId,
  jobVersion,
  canPrepare,
  canDownload,
  onOpenSafety,
  jobDone = false,
  prepareBlocked = null,
  preparedAgain = false,
}: {
  jobId: string;
  /** The job's version as shown: the pack is queued for the job as read (a stale one gets 409). */
  jobVersion: number;
  /** The job is cut or closed: no new cut pack is built for it. */
  jobDone?: boolean;
  /** Fabricators (and supervisors) queue the pack; operators download it. */
  canPrepare: boolean;
  /** Operators and supervisors download, after acknowledging the notices. */
  canDownload: boolean;
  onOpenSafety: () => void;
  /** Why a pack cannot be prepared now though the caller may prepare packs (packPrepareBlockedReason). */
  prepareBlocked?: string | null;
  /** The job was returned and prepared again (preparedAgainAfterReturn): earlier packs are not for it. */
  preparedAgain?: boolean;
}) {
  const scrollFocus = useScrollFocus('Cut pack files');
  const exports = useJobExports(jobId, true);
  const safety = useJobSafety(jobId, true);
  const request = useRequestCutPack(jobId, jobVersion);
  const [downloadError, setDownloadError] = useState<unknown>(null);
  const queryClient = useQueryClient();
  const listed = exports.data?.[0];
  const listedBusy = listed && (listed.state === 'queued' || listed.state === 'running');
  // A queued or running pack (asked for here, or by a release) is followed live until it ends.
  const live = useFollowExport(listedBusy ? listed.id : null, jobId);
  const newest = live.view && live.view.id === listed?.id ? live.view : listed;
  const busy = newest && (newest.state === 'queued' || newest.state === 'running');
  // The files on offer: the newest pack's, or, while a new one is built or after it failed, the last pack built
  // for the same preparation (its files are still stored and still downloadable). The list holds no other.
  const shown = newest?.state === 'done' ? newest : exports.data?.find((e) => e.state === 'done');

  return (
    <Paper variant="outlined" sx={{ p: 2, mt: 2 }} data-testid="cut-pack">
      <Stack direction="row" sx={{ alignItems: 'center', mb: 1 }}>
        <Typography variant="h2" sx={{ flex: 1 }}>
          Cut pack
        </Typography>
        {canPrepare && !prepareBlocked && !busy ? (
          <Button variant="outlined" onClick={() => request.mutate()} disabled={request.isPending}>
            {newest ? 'Prepare the cut pack again' : 'Prepare the cut pack'}
          </Button>
        ) : null}
      </Stack>
      {canPrepare && prepareBlocked ? (
        <Alert severity="warning" sx={{ mb: 1 }} data-testid="cut-pack-blocked">
          {prepareBlocked}
        </Alert>
      ) : null}
      {exports.error ? <FormErrorAlert error={exports.error} /> : null}
      {request.error ? <FormErrorAlert error={request.error} /> : null}
      {downloadError ? <FormErrorAlert error={downloadError} /> : null}
      {live.error ? <FormErrorAlert error={live.error} /> : null}
      {!shown && exports.isSuccess && preparedAgain && !jobDone ? (
        <Typography color="text.secondary" sx={{ mb: 1 }} data-testid="cut-pack-none-for-preparation">
          {NO_PACK_FOR_NEW_PREPARATION}
        </Typography>
      ) : !newest && exports.isSuccess ? (
        <Typography color="text.secondary">
          {canPrepare || !jobDone
            ? 'No cut pack has been prepared for this job yet.'
            : 'No cut pack was kept for this job.'}
        </Typography>
      ) : null}
      {busy ? (
        <Stack spacing={1}>
          <Typography variant="body2">{`Preparing the files (${packProgressText(newest)})`}</Typography>
          <LinearProgress variant="determinate" value={newest.progress} aria-label="Preparing the cut pack" />
        </Stack>
      ) : null}
      {newest?.state === 'failed' ? <Alert severity="error">{packFailureText(newest)}</Alert> : null}
      {shown?.safetyChanged ? (
        // Said to everyone who sees the pack, acknowledged or not: the server builds a released job's pack again by
        // itself (ExportsService.rebuildOutdated), and a fabricator may do it at once.
        <Alert severity="warning" sx={{ mb: 1 }} data-testid="cut-pack-safety-changed">
          {`The safety notices or workshop rules changed since this cut pack was built: its setup sheet and ZIP print the old ones and cannot be downloaded. ${
            jobDone
              ? 'The job has been cut, so no new pack is built for it; the cutting files are unchanged.'
              : canPrepare
                ? 'A new pack is prepared by itself shortly, or prepare it again now.'
                : 'A new pack is prepared by itself shortly (a fabricator or supervisor can also prepare it now); the cutting files are unchanged.'
          }`}
        </Alert>
      ) : null}
      {shown ? (
        safety.data?.acknowledged ? (
          <>
            {shown !== newest ? (
              <Typography
                variant="body2"
                color="text.secondary"
                sx={{ mb: 1 }}
                data-testid="cut-pack-earlier"
              >
                {`The files below are from the cut pack built ${formatDateTime(shown.finishedAt ?? shown.createdAt)}; they stay valid until a new pack is ready.`}
              </Typography>
            ) : null}
            {/* At phone width the row keeps to the name, size and button (the name wraps); the table scrolls
              inside its own box rather than widening the page. */}
            <TableContainer {...scrollFocus} sx={{ overflowX: 'auto' }}>
              <Table
                size="small"
                aria-label="Cut pack files"
                // Narrower cell padding on a phone leaves the names room to wrap between their parts.
                sx={{ '& .MuiTableCell-root': { px: { xs: 1, sm: 2 } } }}
              >
                <TableBody>
                  {shown.files.map((f) => (
                    <TableRow key={f.name}>
                      <TableCell sx={{ overflowWrap: 'break-word' }} data-testid="pack-file-name">
                        {breakableFileName(f.name)}
                      </TableCell>
                      <TableCell sx={{ display: { xs: 'none', sm: 'table-cell' } }}>
                        {PACK_FILE_ROLE_LABELS[f.role] ?? f.role}
                      </TableCell>
                      <TableCell align="right" sx={{ whiteSpace: 'nowrap' }}>
                        {formatBytes(f.bytes)}
                      </TableCell>
                      <TableCell align="right">
                        <Button
                          size="small"
                          aria-label={`Download ${f.name}`}
                          disabled={!!shown.safetyChanged && CUT_PACK_ROLES_PRINTING_SAFETY.includes(f.role)}
                          onClick={() => {
                            setDownloadError(null);
                            downloadExportFile(shown.id, f.name).catch((error: unknown) => {
                              setDownloadError(error);
                              // Refused because the notices, the rules or the pack changed since this page
                              // read them: read them again, so the page shows what to do now.
                              if (isApiError(error) && (error.status === 403 || error.status === 409)) {
                                void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(jobId) });
                                void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(jobId) });
                                // Refused because the job moved on (returned meanwhile): the page shows it so.
                                void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(jobId) });
                              }
                            });
                          }}
                        >
                          Download
                        </Button>
                      </TableCell>
                    </TableRow>
                  ))}
                </TableBody>
              </Table>
            </TableContainer>
          </>
        ) : (
          <Alert
            severity="warning"
            action={
              <Button color="inherit" onClick={onOpenSafety}>
                Read the notices
              </Button>
            }
          >
            {`${
              // With a stale setup sheet, only the cutting files are ready to hand out (said above).
              shown.safetyChanged ? 'The cutting files are ready' : 'The cut pack is ready'
            } (${shown.files.length} files). ${
              canDownload
                ? 'Acknowledge the safety notices to download them.'
                : 'An operator or a supervisor downloads them after acknowledging the safety notices.'
            }`}
          </Alert>
        )
      ) : null}
    </Paper>
  );
}

/**
 * A file name that a narrow column may wrap before its extension as well as after its hyphens
 * ("manifest" / ".json"), never inside a word: breaking anywhere wrote "manifest.jso" over "n" on a phone.
 */
export function breakableFileName(name: string): ReactNode {
  const parts = name.split(/(?=\.)/);
  return parts.map((part, i) => (
    <Fragment key={i}>
      {i > 0 ? <wbr /> : null}
      {part}
    </Fragment>
  ));
}
