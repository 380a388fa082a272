import { type MachineProfileVersionView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import { useTheme } from '@mui/material/styles';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { type VersionChange, versionChanges } from '../../machine-profiles/utils/version-rows';
import { type LengthUnit } from '../../../lib/units';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

/** Long values (notes) wrap where they must instead of widening the page. */
const WRAP = { overflowWrap: 'anywhere', whiteSpace: 'pre-line' } as const;

/** A value as listed: "not set" where the approved version has none, a dash for empty text (no notes). */
const shownBefore = (c: VersionChange) => (c.before === null ? 'not set' : c.before || '—');
const shownAfter = (c: VersionChange) => (c.after === null ? 'removed' : c.after || '—');

/** Only what the waiting version changes against the approved one: old → new. */
export function VersionChanges({
  approved,
  waiting,
  unit,
}: {
  approved: MachineProfileVersionView | null;
  waiting: MachineProfileVersionView;
  /** The unit lengths and speeds are shown in. */
  unit: LengthUnit;
}) {
  // Five columns do not fit a phone: there each setting is a block of its own, old value above the new.
  const phone = useMediaQuery(useTheme().breakpoints.down('sm'), { noSsr: true });
  const changes = versionChanges(approved, waiting, unit);
  const label = `Changes in version ${waiting.number}`;
  const scrollFocus = useScrollFocus(label);
  if (changes.length === 0) {
    return <Typography color="text.secondary">No value differs from the approved version.</Typography>;
  }
  const approvedHeading = approved ? `Approved (version ${approved.number})` : 'Approved';
  const waitingHeading = `Version ${waiting.number}`;
  if (phone) {
    return (
      <Box
        component="ul"
        aria-label={label}
        data-testid="version-changes"
        sx={{ listStyle: 'none', m: 0, p: 0, '& > li + li': { borderTop: 1, borderColor: 'divider' } }}
      >
        {changes.map((c) => (
          <PhoneChange
            key={c.key}
            change={c}
            approvedHeading={approvedHeading}
            waitingHeading={waitingHeading}
          />
        ))}
      </Box>
    );
  }
  return (
    // A table wider than its box (long names) scrolls inside it rather than widening the page.
    <TableContainer {...scrollFocus} sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label={label} data-testid="version-changes" sx={{ '& td, & th': { py: 0.5 } }}>
        <TableHead>
          <TableRow>
            <TableCell>Material or machine</TableCell>
            <TableCell>Setting</TableCell>
            <TableCell>{approvedHeading}</TableCell>
            <TableCell aria-hidden="true" />
            <TableCell>{waitingHeading}</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {changes.map((c) => (
            <TableRow key={c.key} data-testid="version-change">
              <TableCell>{c.section}</TableCell>
              <TableCell>{c.label}</TableCell>
              <TableCell
                sx={{
                  ...WRAP,
                  color: 'text.secondary',
                  textDecoration: c.before ? 'line-through' : undefined,
                }}
              >
                {shownBefore(c)}
              </TableCell>
              <TableCell aria-hidden="true">→</TableCell>
              <TableCell sx={{ ...WRAP, fontWeight: 600 }}>{shownAfter(c)}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableContainer>
  );
}

/** One change on a phone: the setting's name, then its old and its new value, each on a line of its own. */
function PhoneChange({
  change: c,
  approvedHeading,
  waitingHeading,
}: {
  change: VersionChange;
  approvedHeading: string;
  waitingHeading: string;
}) {
  return (
    <Box component="li" data-testid="version-change" sx={{ py: 1 }}>
      <Typography variant="subtitle2" component="p">
        {`${c.section} · ${c.label}`}
      </Typography>
      <Box
        component="dl"
        sx={{
          display: 'grid',
          gridTemplateColumns: 'auto minmax(0, 1fr)',
          columnGap: 1.5,
          rowGap: 0.25,
          m: 0,
          '& dt': { color: 'text.secondary', typography: 'body2' },
          '& dd': { m: 0, typography: 'body2', ...WRAP },
        }}
      >
        <dt>{approvedHeading}</dt>
        <Box
          component="dd"
          sx={{ color: 'text.secondary', textDecoration: c.before ? 'line-through' : undefined }}
        >
          {shownBefore(c)}
        </Box>
        <dt>{waitingHeading}</dt>
        <Box component="dd" sx={{ fontWeight: 600 }}>
          {shownAfter(c)}
        </Box>
      </Box>
    </Box>
  );
}
