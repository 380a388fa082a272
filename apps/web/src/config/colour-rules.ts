import { type COLOUR_RULES } from '@kerfwright/contracts';

/** How each colour rule is named in forms (the rule's id stays in the saved spec). */
export const COLOUR_RULE_LABELS: Record<(typeof COLOUR_RULES)[number], string> = {
  'neighbour-distinct': 'Neighbours differ',
  'vertex-distinct': 'All pieces around a vertex differ',
  'opposite-match': 'Opposite pieces match, neighbours differ',
};
