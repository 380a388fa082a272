import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';

interface ColourPlanNoticeProps {
  /** Why the colour rule has no plan, from the engine. */
  message: string;
  /** The fewest colours that meet the rule, when the engine found them. */
  fewest: number | null;
  /** The most colours the form accepts. */
  maxColours: number;
  onUseColours?: (count: number) => void;
}

/** The colour rule cannot be met: says why and, when the form allows it, offers the fewest colours that work. */
export function ColourPlanNotice({ message, fewest, maxColours, onUseColours }: ColourPlanNoticeProps) {
  const offer = onUseColours && fewest !== null && fewest <= maxColours ? fewest : null;
  return (
    <Alert
      severity="warning"
      sx={{ mb: 1 }}
      data-testid="colour-plan-notice"
      action={
        offer !== null ? (
          <Button
            color="inherit"
            size="small"
            sx={{ whiteSpace: 'nowrap' }}
            onClick={() => onUseColours?.(offer)}
          >
            Use {offer} colours
          </Button>
        ) : undefined
      }
    >
      {message}
    </Alert>
  );
}
