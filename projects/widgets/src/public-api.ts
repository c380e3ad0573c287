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
  problemMessage,
  type TroplineApiError,
  type ApiFieldError,
} from './lib/api/problem-message';
export { troplineEcharts } from './lib/api/tropline-echarts';
export { CautionNotice, DEFAULT_CAUTIONS } from './lib/caution-notice/caution-notice';
export { ProjectionPanel } from './lib/projection-panel/projection-panel';
export { TrajectoryChart } from './lib/trajectory-chart/trajectory-chart';
export {
  trajectoryChartOptions,
  describeTrajectory,
  formatUnit,
  type TrajectoryData,
  type TrajectorySeries,
  type TrajectoryChartSettings,
} from './lib/trajectory-chart/trajectory-chart-options';
