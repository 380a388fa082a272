import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { memo } from 'react';
import { countOf } from '../../../lib/plural';
import { formatQuantity } from '../../../lib/units';
import { useDelayedFlag } from '../../../lib/use-delayed-flag';
import { type BuiltPreview } from '../lib/build-preview';
import { solidName } from '../lib/solid-name';
import { ColourPlanNotice } from './colour-plan-notice';
import { MAX_COLOURS, DESIGN_FIELD_LABELS } from './design-form-schema';
import { ModelPreview3d } from './model-preview-3d';

interface StudioPreviewPanelProps {
  preview: BuiltPreview;
  /** Shown when there is no model and the engine gave no reason (e.g. a field error, no upload yet). */
  idleMessage: string;
  selectedPiece: string | undefined;
  onSelectPiece: (id: string) => void;
  formatLength: (mm: number) => string;
  /** Sets the form's colour count (offered when the rule needs more colours). */
  onUseColours?: (count: number) => void;
  /** While "fit to sheets" searches: the sheets asked for. The model shown meanwhile is an earlier fit. */
  fittingSheets?: number | null;
  /** The form has errors: the model shown is the last one the form described without errors. */
  showingLastValid?: boolean;
  /** The model of the values entered is being built (in the preview worker); the one shown is earlier. */
  building?: boolean;
  /**
   * "Fit to sheets" found no size (see unfittedNote): why, and at what size the model is shown instead. Its
   * sizes are then marked "not fitted".
   */
  unfitted?: string | null;
}

/**
 * Why "fit to sheets" shows a model of no fitted size, for the preview (null while it searches or once it
 * found a size): with no colour plan no search runs, and the model is the search's upper bound (the largest
 * piece fits a sheet, the pieces' area fills the sheets); when no size fits, it is the last size tried.
 */
export function unfittedNote(
  fit: {
    sheets: number;
    pending: boolean;
    result: { sheets: unknown[]; failure: string | null } | null;
  } | null,
): string | null {
  if (!fit || fit.pending || !fit.result || fit.result.sheets.length > 0) return null;
  const on = countOf(fit.sheets, 'sheet');
  return /^no plan exists/i.test(fit.result.failure ?? '')
    ? `No size is fitted to ${on} while the colour rule cannot be met: the model is shown at the most the ` +
        'sheets could hold, an upper bound.'
    : `No size fits ${on}: the model is shown at the last size tried (see Sheets).`;
}

/** How long a build runs before the panel says so (quicker ones would only make it flicker). */
export const BUILDING_NOTICE_DELAY_MS = 250;

/**
 * The model's facts and its 3D view. Memoised on the built preview: the keystroke itself re-renders the
 * form only, and this panel follows once the build has finished. A build that takes a while is said, and the
 * model built before stays on screen, dimmed and marked busy, until the new one replaces it.
 */
export const StudioPreviewPanel = memo(function StudioPreviewPanel({
  preview,
  idleMessage,
  selectedPiece,
  onSelectPiece,
  formatLength: fmt,
  onUseColours,
  fittingSheets = null,
  showingLastValid = false,
  building = false,
  unfitted = null,
}: StudioPreviewPanelProps) {
  const report = preview.report;
  const fitting = fittingSheets !== null;
  const slowBuild = useDelayedFlag(building && !fitting, BUILDING_NOTICE_DELAY_MS);
  const buildingText =
    report || preview.failure ? 'Building the model for the values entered…' : 'Building the model…';
  const earlier = fitting || slowBuild;
  const fittingText = fitting ? `Fitting the largest size on ${countOf(fittingSheets, 'sheet')}…` : '';
  // Sizes of an earlier fit are not the size being fitted: they give way to the search's progress.
  const size = (mm: number) => (fitting ? 'fitting…' : unfitted ? `${fmt(mm)} (not fitted)` : fmt(mm));
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      {showingLastValid && report ? (
        <Alert severity="warning" sx={{ mb: 1 }} data-testid="preview-last-valid">
          Correct the marked fields: the model below is the last one without errors.
        </Alert>
      ) : null}
      {fitting ? (
        <Box sx={{ mb: 1 }} data-testid="preview-fitting" role="status">
          <Typography variant="body2" color="text.secondary">
            {report ? `${fittingText} The model below is at the size shown before.` : fittingText}
          </Typography>
          <LinearProgress aria-label={fittingText} sx={{ mt: 0.5 }} />
        </Box>
      ) : slowBuild ? (
        // Said in words, without a moving bar: an animated bar is laid out and painted on every frame, and with
        // one the worker's builds took about a third longer (medians 0.71 s against 0.52 s, a 120-piece design
        // in Chromium on a 2-core machine drawing without a GPU).
        <Box sx={{ mb: 1 }} data-testid="preview-building" role="status">
          <Typography variant="body2" color="text.secondary">
            {report ? `${buildingText} The model below is the one built before.` : buildingText}
          </Typography>
        </Box>
      ) : null}
      {report && unfitted && !fitting ? (
        <Alert severity="info" sx={{ mb: 1 }} data-testid="preview-unfitted">
          {unfitted}
        </Alert>
      ) : null}
      {report ? (
        <Box sx={earlier ? { opacity: 0.55 } : undefined} aria-busy={earlier || undefined}>
          <Stack
            direction="row"
            spacing={3}
            sx={{ mb: 1, flexWrap: 'wrap' }}
            useFlexGap
            data-testid="model-facts"
          >
            <Fact
              label={DESIGN_FIELD_LABELS.solidId}
              value={preview.spec ? solidName(preview.spec.solid) : report.solid.name}
            />
            <Fact label="Pieces" value={String(report.pieces.length)} />
            <Fact label="Crossings" value={String(report.crossings.length)} />
            <Fact label="Diameter" value={size(report.diameterMm)} />
            <Fact label="Plane distance" value={size(report.planeDistanceMm)} />
            <Fact label="Built in" value={formatQuantity(Math.round(preview.buildMs), 'ms')} />
          </Stack>
          {preview.colourMessage ? (
            <ColourPlanNotice
              message={preview.colourMessage}
              fewest={preview.colourFewest}
              maxColours={MAX_COLOURS}
              {...(onUseColours ? { onUseColours } : {})}
            />
          ) : null}
          {/* The 3D view with its buttons and key hint below it. */}
          <Box sx={{ height: 476 }}>
            <ModelPreview3d
              report={report}
              pieceColours={preview.pieceColour}
              modelKey={preview.key}
              selectedPiece={selectedPiece}
              onSelectPiece={onSelectPiece}
            />
          </Box>
        </Box>
      ) : fitting || (building && !preview.failure) ? null : (
        <Alert
          severity={preview.failure ? 'error' : 'info'}
          data-testid="preview-unavailable"
          sx={slowBuild ? { opacity: 0.55 } : undefined}
          aria-busy={slowBuild || undefined}
        >
          {preview.failure ?? idleMessage}
        </Alert>
      )}
    </Paper>
  );
});

export function Fact({ label, value }: { label: string; value: string }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" sx={{ fontWeight: 500 }}>
        {value}
      </Typography>
    </Box>
  );
}
