// Public API of the cataloguer (pure TypeScript: measurements and paths in, plain objects out).
export * from "./taxonomy";
export { parseName, parseNames, isRoundRobinSeries, tokenise, MIC_POSITIONS, type MicPosition, type NameCounter, type NameInfo, type VelocityHint, type VelocityScheme } from "./names";
export { featureVector, fitStandardiser, standardise, distance, decaySec, FEATURE_NAMES, FEATURE_COUNT, type Standardiser } from "./features";
export {
  suggestFromSound, suggestByRules, ruleScores, articulationFromSound, describeSound, buildLabelModel, nameSoundConflict,
  type SoundSuggestion, type LabelModel, type LabelledExample, type NameSoundConflict,
} from "./classify";
export { groupInstruments, mergeInstruments, mergeInList, splitByPitch, instrumentKey, instrumentDisplayName, descriptorsOf, type Instrument, type InstrumentInput } from "./instruments";
export {
  hitDistance, identityFeatures, splitBySound, namesMarkSeries, averageLinkage, clusterAtHeight, shapeResidualDb, envelopeDb, IDENTITY, SPLIT_FAMILIES,
  type IdentityParams, type IdentityFeatures, type HitDistance, type IdentityMember, type SoundInstrument,
} from "./identity";
export { sortLayers, layerCountFromGaps, clusterSizes, isMonotonic, type Layer, type LayerMember, type LayerSorting, type LayerIssue, type LayerIssueCode, type LayerOptions, type GapChoice } from "./layers";
export { DLS, dlsAttenuationDb, dannenbergCoefficients, dannenbergGainDb, curveAttenuationDb, velocityForAttenuation, velocityRanges, type VelocityCurve, type VelocityRange } from "./velocity";
export { fileHealth, layerHealth, conflictHealth, sortFindings, severityOf, type HealthCode, type HealthFinding, type HealthOptions, type HealthSample, type Severity } from "./health";
export { catalogueSamples, groupKeyOf, soundFit, SOUND_FIT_SHOWN, type SoundFit, type Catalogue, type CatalogueEntry, type SortedInstrument, type CatalogueOptions, type CatalogueSampleInput, type LayerGroup, type LabelSource } from "./catalogue";
export { instrumentPitchHz, mainStroke, type PitchedHit } from "./instrument-pitch";
