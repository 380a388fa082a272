import { type DesignIssue } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { countOf } from '../../../lib/plural';

/**
 * The validity report: errors (block files) and warnings, each with chips for the pieces it concerns. Long
 * reports show the first `limit` findings and a button for the rest. When the findings are one piece's only,
 * `reportErrors` counts the errors of the whole report: the design is said to be free of problems only when
 * that is none.
 */
export function ReportIssues({
  errors,
  warnings,
  onSelectPiece,
  limit = 12,
  reportErrors = errors.length,
}: {
  errors: readonly DesignIssue[];
  warnings: readonly DesignIssue[];
  onSelectPiece: (id: string) => void;
  limit?: number;
  reportErrors?: number;
}) {
  const [showAll, setShowAll] = useState(false);
  if (errors.length === 0 && warnings.length === 0 && reportErrors > 0) {
    return (
      <Alert severity="info" data-testid="report-piece-clear">
        No finding concerns this piece, but the design has {countOf(reportErrors, 'error')}: see the Report
        tab.
      </Alert>
    );
  }
  if (errors.length === 0 && warnings.length === 0) {
    return (
      <Alert severity="success" data-testid="report-valid">
        The engine found no problems: every slot opens from its piece&apos;s edge and nothing collides.
      </Alert>
    );
  }
  const items = [
    ...errors.map((issue) => ({ issue, severity: 'error' as const })),
    ...warnings.map((issue) => ({ issue, severity: 'warning' as const })),
  ];
  return (
    <Stack spacing={1} data-testid="report-issues">
      {(showAll ? items : items.slice(0, limit)).map(({ issue, severity }, i) => (
        <Alert key={i} severity={severity} variant="outlined">
          {issue.message}
          {issue.pieces.length > 0 ? (
            <Stack direction="row" spacing={0.5} sx={{ mt: 0.5, flexWrap: 'wrap' }} useFlexGap>
              {issue.pieces.slice(0, 8).map((id) => (
                <Chip key={id} size="small" label={id} onClick={() => onSelectPiece(id)} />
              ))}
            </Stack>
          ) : null}
        </Alert>
      ))}
      {items.length > limit ? (
        <Alert
          severity="info"
          action={
            <Button color="inherit" size="small" onClick={() => setShowAll((v) => !v)}>
              {showAll ? 'Show fewer' : `Show all ${items.length}`}
            </Button>
          }
        >
          {showAll
            ? `All ${items.length} findings are shown.`
            : `${items.length - limit} more findings are not shown.`}
        </Alert>
      ) : null}
    </Stack>
  );
}
