/** Public API of colour plans. */
export {
  solveColourPlan,
  edgeAdjacentFaces,
  facesAroundVertices,
  oppositePairsFromNormals,
  ColourPlanInputError,
  type ColourPlan,
  type ColourPlanInput,
  type ColourRule,
} from './colour-plan';
