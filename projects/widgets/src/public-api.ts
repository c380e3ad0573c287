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
export { troplineEcharts } from './lib/api/tropline-echarts';
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
