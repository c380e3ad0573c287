/*
 * Public API of @tropline/widgets. Every public name is listed one by one.
 */
export { provideTropline } from './lib/api/provide-tropline';
export {
  TROPLINE_OPTIONS,
  defaultTroplineOptions,
  type TroplineOptions,
  type ResolvedTroplineOptions,
} from './lib/api/tropline-options';
export { TroplineClient } from './lib/api/tropline-client';
export {
  DEFAULT_TROPLINE_STRINGS,
  TROPLINE_STRINGS,
  type TroplineStrings,
} from './lib/api/tropline-strings';
export type {
  ComparisonRequest,
  ComparisonResult,
  EquilibriaResponse,
  Exponent,
  JobStatus,
  JobView,
  LevelOutcome,
  PercentileBands,
  Regime,
  RegimeRequest,
  RegimeResponse,
  ScenarioChange,
  ScenarioOutcome,
  SweepPoint,
  SweepRequest,
  SweepResult,
} from './lib/api/analysis-types';
export { parseEventStream, type ParsedStream, type StreamEvent } from './lib/api/event-stream';
export {
  problemMessage,
  problemFromDocument,
  type TroplineApiError,
  type ApiFieldError,
} from './lib/api/problem-message';
export { loadTroplineEcharts, type TroplineEcharts } from './lib/api/tropline-echarts';
export { CautionNotice, DEFAULT_CAUTIONS } from './lib/caution-notice/caution-notice';
export { ProjectionPanel } from './lib/projection-panel/projection-panel';
export { TrajectoryChart } from './lib/trajectory-chart/trajectory-chart';
export {
  trajectoryChartOptions,
  trajectoryTable,
  describeTrajectory,
  formatUnit,
  type TrajectoryBand,
  type TrajectoryData,
  type TrajectoryObservations,
  type TrajectorySeries,
  type TrajectoryChartSettings,
} from './lib/trajectory-chart/trajectory-chart-options';
export { ChartFigure } from './lib/chart-figure/chart-figure';
export { tableCsv, type ChartTable } from './lib/chart-figure/chart-export';
export { type ChartPalette, readPalette } from './lib/chart-figure/chart-palette';
export { zoomWindow, type ZoomKey, type ZoomWindow } from './lib/chart-figure/zoom-keys';
export { ParameterForm, type ParameterProblem } from './lib/parameter-form/parameter-form';
export {
  parameterGroups,
  fieldProblem,
  applyParameters,
  checkParameters,
  parameterFieldId,
  fieldErrorMessages,
  PARAMETER_ID_PREFIX,
  type ParameterCheck,
  type ParameterBounds,
  type ParameterField,
  type ParameterGroup,
} from './lib/parameter-form/parameter-form-schema';
export { PhasePortrait, type PhasePortraitView } from './lib/phase-portrait/phase-portrait';
export {
  phasePortrait3dOptions,
  describePhasePortrait3d,
  viewBasis,
  projectPoint,
  turnView,
  DEFAULT_VIEW_ANGLES,
  VIEW_STEP,
  type PhasePortrait3dSettings,
  type Vec3,
  type ViewAngles,
  type ViewBasis,
  type ViewKey,
} from './lib/phase-portrait/phase-portrait-3d-options';
export {
  phasePortraitOptions,
  phasePortraitTable,
  describePhasePortrait,
  twoLevelNullclines,
  type Nullclines,
  type PhasePortraitSettings,
} from './lib/phase-portrait/phase-portrait-options';
export { BifurcationChart, sweepAxes } from './lib/bifurcation-chart/bifurcation-chart';
export {
  bifurcationChartOptions,
  bifurcationTable,
  describeBifurcation,
  REGIME_SYMBOLS,
  type BifurcationAxes,
  type BifurcationSettings,
} from './lib/bifurcation-chart/bifurcation-chart-options';
export { RegimeSummary } from './lib/regime-summary/regime-summary';
export {
  regimeSummaryText,
  type RegimeSummaryText,
  type SummaryEquilibrium,
  type SummaryFact,
} from './lib/regime-summary/regime-summary-text';
export { ScenarioComparison } from './lib/scenario-comparison/scenario-comparison';
export {
  comparisonChartOptions,
  comparisonTable,
  describeComparison,
  type ComparisonChartSettings,
  type ComparisonLayout,
} from './lib/scenario-comparison/scenario-comparison-options';
export {
  comparisonRows,
  NOTABLE_CHANGE,
  type ComparisonCell,
  type ComparisonRow,
} from './lib/scenario-comparison/scenario-comparison-table';
export { JobProgress } from './lib/job-progress/job-progress';
export { jobState, type JobState } from './lib/job-strip/job-state';
export { JobStrip } from './lib/job-strip/job-strip';
