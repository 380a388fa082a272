import { COLOUR_RULES } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import { COLOUR_RULE_LABELS } from '../../../config/colour-rules';
import { countOf } from '../../../lib/plural';

interface ColourPlanNoticeProps {
  /** Why the colour rule has no plan, from the engine. */
  message: string;
  /** The fewest colours that meet the rule, when the engine found them. */
  fewest: number | null;
  /** The most colours the form accepts. */
  maxColours: number;
  onUseColours?: (count: number) => void;
}

/** The engine's "no plan exists: rule "…" cannot be met with k colours[; it needs at least n]". */
const NO_PLAN = /rule "([^"]+)" cannot be met with (\d+) colours?/;

/**
 * The engine's reason in the studio's words, with the rule named as the form names it:
 * "“Neighbours differ” cannot be met with 2 colours: it needs at least 3." A reason of another shape is
 * shown as a sentence of its own.
 */
export function colourPlanSentence(message: string, fewest: number | null): string {
  const match = NO_PLAN.exec(message);
  if (match) {
    const rule = match[1]!;
    const label = (COLOUR_RULES as readonly string[]).includes(rule)
      ? COLOUR_RULE_LABELS[rule as (typeof COLOUR_RULES)[number]]
      : rule;
    const cannot = `“${label}” cannot be met with ${countOf(Number(match[2]), 'colour')}`;
    return fewest !== null ? `${cannot}: it needs at least ${fewest}.` : `${cannot}.`;
  }
  const text = message.replace(/^no plan exists:?\s*/i, '').trim();
  if (!text) return 'The colour rule cannot be met with these colours.';
  const sentence = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(sentence) ? sentence : `${sentence}.`;
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
      {colourPlanSentence(message, fewest)}
    </Alert>
  );
}
