import { type DesignReport } from '@kerfwright/contracts';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import TextField from '@mui/material/TextField';
import Box from '@mui/material/Box';
import { memo, useId, useMemo } from 'react';
import { AssemblySteps } from './assembly-steps';
import { CrossingTable } from './crossing-table';
import { PieceView2d } from './piece-view-2d';
import { ReportIssues } from './report-issues';
import { countOf } from '../../../lib/plural';

interface StudioDetailsPanelProps {
  report: DesignReport;
  pieceColour: Record<string, number>;
  tab: number;
  onTab: (tab: number) => void;
  selectedPiece: string | undefined;
  onSelectPiece: (id: string) => void;
  formatLength: (mm: number) => string;
  /** The figures are of an earlier model while a newer one is on its way (a fit in progress): dimmed. */
  busy?: boolean;
}

/** One piece in 2D, the crossings, the validity report and the assembly order. Memoised like the preview panel. */
export const StudioDetailsPanel = memo(function StudioDetailsPanel({
  report,
  pieceColour,
  tab,
  onTab,
  selectedPiece,
  onSelectPiece,
  formatLength: fmt,
  busy = false,
}: StudioDetailsPanelProps) {
  const piece = report.pieces.find((p) => p.id === selectedPiece) ?? report.pieces[0];
  // A piece chip in the report or the assembly order opens that piece.
  const showPiece = (id: string) => {
    onSelectPiece(id);
    onTab(0);
  };
  const flaggedPieces = useMemo(
    () => new Set([...report.errors, ...report.warnings].flatMap((i) => i.pieces)),
    [report],
  );
  // The tabs and the panel they show name each other (WAI-ARIA tabs pattern): a screen reader says which tab's
  // content it is in, and the tabs lead to it.
  const ids = useId();
  return (
    <Paper variant="outlined" sx={{ p: 2, opacity: busy ? 0.55 : 1 }} aria-busy={busy || undefined}>
      <DetailTabs
        ids={ids}
        tab={tab}
        onTab={onTab}
        crossings={report.crossings.length}
        errors={report.errors.length}
        warnings={report.warnings.length}
      />
      <Box role="tabpanel" id={`${ids}-panel`} aria-labelledby={`${ids}-tab-${tab}`}>
        {tab === 0 && piece ? (
          <Stack spacing={1}>
            <TextField
              select
              size="small"
              label="Piece"
              value={piece.id}
              onChange={(e) => onSelectPiece(e.target.value)}
              sx={{ maxWidth: 200 }}
            >
              {report.pieces.map((p) => (
                <MenuItem key={p.id} value={p.id}>
                  {p.id}
                </MenuItem>
              ))}
            </TextField>
            <PieceView2d
              piece={piece}
              colourIndex={pieceColour[piece.id]}
              flagged={flaggedPieces.has(piece.id)}
              formatLength={fmt}
            />
            <ReportIssues
              errors={report.errors.filter((i) => i.pieces.includes(piece.id))}
              warnings={report.warnings.filter((i) => i.pieces.includes(piece.id))}
              onSelectPiece={onSelectPiece}
              limit={4}
              reportErrors={report.errors.length}
            />
            <CrossingTable crossings={report.crossings} pieceId={piece.id} formatLength={fmt} />
          </Stack>
        ) : null}
        {tab === 1 ? <CrossingTable crossings={report.crossings} formatLength={fmt} /> : null}
        {tab === 2 ? (
          <ReportIssues errors={report.errors} warnings={report.warnings} onSelectPiece={showPiece} />
        ) : null}
        {tab === 3 ? <AssemblySteps report={report} onSelectPiece={showPiece} /> : null}
      </Box>
    </Paper>
  );
});

/**
 * The tab bar, memoised on its counts: MUI's tabs measure themselves (a forced layout) after each render,
 * which an edit that keeps the counts need not pay.
 */
const DetailTabs = memo(function DetailTabs({
  ids,
  tab,
  onTab,
  crossings,
  errors,
  warnings,
}: {
  /** The start of the tabs' and the panel's element ids. */
  ids: string;
  tab: number;
  onTab: (tab: number) => void;
  crossings: number;
  errors: number;
  warnings: number;
}) {
  return (
    // Four tabs outgrow a phone's width: the bar scrolls (with arrows on touch screens too) instead of clipping.
    <Tabs
      value={tab}
      onChange={(_, t: number) => onTab(t)}
      variant="scrollable"
      scrollButtons="auto"
      allowScrollButtonsMobile
      aria-label="Details of the design"
      sx={{ mb: 2 }}
    >
      {[
        'Piece',
        `Crossings (${crossings})`,
        `Report (${countOf(errors, 'error')}, ${countOf(warnings, 'warning')})`,
        'Assembly',
      ].map((label, i) => (
        <Tab key={i} label={label} id={`${ids}-tab-${i}`} aria-controls={`${ids}-panel`} />
      ))}
    </Tabs>
  );
});
