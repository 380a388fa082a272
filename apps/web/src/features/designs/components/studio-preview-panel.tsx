import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { memo } from 'react';
import { type BuiltPreview } from '../hooks/use-built-model';
import { ColourPlanNotice } from './colour-plan-notice';
import { MAX_COLOURS } from './design-form-schema';
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
}

/**
 * The model's facts and its 3D view. Memoised on the built preview: the keystroke itself re-renders the
 * form only, and this panel follows once the deferred build has finished.
 */
export const StudioPreviewPanel = memo(function StudioPreviewPanel({
  preview,
  idleMessage,
  selectedPiece,
  onSelectPiece,
  formatLength: fmt,
  onUseColours,
}: StudioPreviewPanelProps) {
  const report = preview.model?.report ?? null;
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      {report ? (
        <>
          <Stack
            direction="row"
            spacing={3}
            sx={{ mb: 1, flexWrap: 'wrap' }}
            useFlexGap
            data-testid="model-facts"
          >
            <Fact label="Solid" value={report.solid.name} />
            <Fact label="Pieces" value={String(report.pieces.length)} />
            <Fact label="Crossings" value={String(report.crossings.length)} />
            <Fact label="Diameter" value={fmt(report.diameterMm)} />
            <Fact label="Plane distance" value={fmt(report.planeDistanceMm)} />
            <Fact label="Built in" value={`${preview.buildMs.toFixed(0)} ms`} />
          </Stack>
          {preview.colourMessage ? (
            <ColourPlanNotice
              message={preview.colourMessage}
              fewest={preview.colourFewest}
              maxColours={MAX_COLOURS}
              {...(onUseColours ? { onUseColours } : {})}
            />
          ) : null}
          <Box sx={{ height: 420 }}>
            <ModelPreview3d
              report={report}
              pieceColours={preview.pieceColour}
              modelKey={preview.key}
              selectedPiece={selectedPiece}
              onSelectPiece={onSelectPiece}
            />
          </Box>
        </>
      ) : (
        <Alert severity={preview.failure ? 'error' : 'info'} data-testid="preview-unavailable">
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
