/*
 * @tropline/widgets/testing: test doubles and harnesses for host apps' own tests.
 */
export {
  FakeTroplineClient,
  provideFakeTroplineClient,
  provideTroplineTesting,
  type AnalysisSteps,
  type FakeAnalyses,
  type FakeRequests,
  type FakeTroplineClientOptions,
} from './fake-tropline-client';
export { ENGINE_ANALYSES } from './engine-analyses';
export { benchmarkSweep } from './benchmark-sweep';
export { engineTrajectory } from './engine-trajectory';
export { TroplineChartHarness } from './chart-figure-harness';
export { TrajectoryChartHarness } from './trajectory-chart-harness';
export {
  BifurcationChartHarness,
  ParameterFormHarness,
  PhasePortraitHarness,
  RegimeSummaryHarness,
  ScenarioComparisonHarness,
} from './widget-harnesses';
