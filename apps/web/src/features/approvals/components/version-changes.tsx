import { type MachineProfileVersionView } from '@kerfwright/contracts';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { versionChanges } from '../../machine-profiles/utils/version-rows';

/** Only what the waiting version changes against the approved one: old → new. */
export function VersionChanges({
  approved,
  waiting,
}: {
  approved: MachineProfileVersionView | null;
  waiting: MachineProfileVersionView;
}) {
  const changes = versionChanges(approved, waiting);
  if (changes.length === 0) {
    return <Typography color="text.secondary">No value differs from the approved version.</Typography>;
  }
  return (
    // On a phone the table scrolls inside its own box: every column stays readable.
    <TableContainer sx={{ overflowX: 'auto' }}>
      <Table
        size="small"
        aria-label={`Changes in version ${waiting.number}`}
        data-testid="version-changes"
        sx={{ '& td, & th': { py: 0.5 } }}
      >
        <TableHead>
          <TableRow>
            <TableCell>Material or machine</TableCell>
            <TableCell>Value</TableCell>
            <TableCell>{approved ? `Approved (version ${approved.number})` : 'Approved'}</TableCell>
            <TableCell aria-hidden="true" />
            <TableCell>{`Version ${waiting.number}`}</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {changes.map((c) => (
            <TableRow key={c.key} data-testid="version-change">
              <TableCell>{c.section}</TableCell>
              <TableCell>{c.label}</TableCell>
              <TableCell
                sx={{ color: 'text.secondary', textDecoration: c.before ? 'line-through' : undefined }}
              >
                {c.before ?? 'not set'}
              </TableCell>
              <TableCell aria-hidden="true">→</TableCell>
              <TableCell sx={{ fontWeight: 600 }}>{c.after ?? 'removed'}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableContainer>
  );
}
