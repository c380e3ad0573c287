/** Projections compare scenarios; they are not forecasts. */
export const CAUTION_SCENARIO_NOT_FORECAST =
  'Projections are model outputs for comparing scenarios, not forecasts of what will happen.';

/** Chaos caps how far ahead any projection means anything. */
export const CAUTION_PREDICTABILITY_HORIZON =
  'Where the modelled system is chaotic, no projection is meaningful past its predictability ' +
  'horizon: small differences in the starting state grow until the trajectories share nothing.';

/** Management decisions rest with qualified people under local law. */
export const CAUTION_MANAGEMENT_DECISIONS =
  'Harvest, stocking and culling decisions rest with qualified biologists and the law that binds ' +
  'them; this tool defers to local regulations and licensed practice.';

/** Every caution a projection response carries, in display order. */
export const PROJECTION_CAUTIONS: readonly string[] = Object.freeze([
  CAUTION_SCENARIO_NOT_FORECAST,
  CAUTION_PREDICTABILITY_HORIZON,
  CAUTION_MANAGEMENT_DECISIONS,
]);
