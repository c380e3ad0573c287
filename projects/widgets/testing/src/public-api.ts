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
export { TrajectoryChartHarness } from './trajectory-chart-harness';
