export { ContentError } from './content-error';
export {
  DEFERRAL_TERMS,
  lastParagraph,
  loadSafetyNotices,
  missingDeferralTerms,
  parseSafetyNotice,
} from './safety-notices';
export {
  loadMaterialHazards,
  loadMaterialHazardTable,
  parseMaterialHazards,
  type MaterialHazardTable,
} from './material-hazards';
export {
  jobSpec,
  PROFILE_STATUSES,
  profileVersionState,
  type ProfileStatus,
  loadScenario,
  parseScenario,
  readDesignSpec,
  specFor,
  type LoadScenarioOptions,
  type Scenario,
  type ScenarioAcknowledgement,
  type ScenarioDesign,
  type ScenarioJob,
  type ScenarioJobEvent,
  type ScenarioMachineProfile,
  type ScenarioMaterial,
  type ScenarioProfileSetting,
  type ScenarioStockSheet,
  type ScenarioUser,
} from './scenario';
export { contentPaths, type ContentPaths } from './content-paths';
