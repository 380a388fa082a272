/** How each colour rule is named in forms: shared with the API's messages (contracts). */
export { COLOUR_RULE_LABELS } from '@kerfwright/contracts';
