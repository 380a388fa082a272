import { type JobTransitionView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { type Theme } from '@mui/material/styles';
import useMediaQuery from '@mui/material/useMediaQuery';
import { formatDateTime } from '../../../lib/dates';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

/** "requested → prepared", or for a change of copies or notes "draft: changed". */
function stepText(t: JobTransitionView): string {
  return t.action === 'change' ? `${t.to}: changed` : `${t.from ?? 'new'} → ${t.to}`;
}

/**
 * A job's steps, oldest first: when, the step, by whom, and the reason or what changed. A table on wider
 * screens; on a phone a list, each step on its own lines, so nothing needs sideways scrolling.
 */
export function JobHistory({ transitions }: { transitions: readonly JobTransitionView[] }) {
  const scrollFocus = useScrollFocus('History');
  const phone = useMediaQuery((theme: Theme) => theme.breakpoints.down('sm'));
  if (phone)
    return (
      <Box component="ol" aria-label="History" sx={{ listStyle: 'none', p: 0, m: 0 }}>
        {transitions.map((t, i) => (
          <Box
            component="li"
            key={i}
            sx={{ py: 1, borderBottom: 1, borderColor: 'divider', '&:last-of-type': { borderBottom: 0 } }}
          >
            <Typography variant="body2" sx={{ fontWeight: 600 }}>
              {stepText(t)}
            </Typography>
            <Typography variant="body2" color="text.secondary">
              {`${formatDateTime(t.at)} · ${t.actorName ?? '—'}`}
            </Typography>
            {t.reason ? (
              <Typography variant="body2" sx={{ overflowWrap: 'anywhere' }}>
                {t.reason}
              </Typography>
            ) : null}
          </Box>
        ))}
      </Box>
    );
  return (
    <TableContainer {...scrollFocus} sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label="History">
        <TableHead>
          <TableRow>
            <TableCell>When</TableCell>
            <TableCell>Step</TableCell>
            <TableCell>By</TableCell>
            <TableCell>Reason or change</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {transitions.map((t, i) => (
            <TableRow key={i}>
              <TableCell>{formatDateTime(t.at)}</TableCell>
              <TableCell>{stepText(t)}</TableCell>
              <TableCell>{t.actorName ?? '—'}</TableCell>
              <TableCell sx={{ minWidth: 160 }}>{t.reason ?? ''}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableContainer>
  );
}
