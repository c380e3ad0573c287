import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import {
  benchmarkSweep,
  BifurcationChartHarness,
  FakeTroplineClient,
  type FakeTroplineClientOptions,
  provideTroplineTesting,
} from '@tropline/widgets/testing';
import { ENGINE_ANALYSES } from '../../../testing/src/engine-analyses';
import type { SweepRequest } from '../api/analysis-types';
import { BifurcationChart } from './bifurcation-chart';

const sweep = benchmarkSweep();

@Component({
  imports: [BifurcationChart],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-bifurcation-chart [request]="request()" />`,
})
class Host {
  readonly request = signal<SweepRequest | undefined>(sweep);
}

async function until(fixture: { whenStable(): Promise<unknown> }, done: () => Promise<boolean>) {
  for (let i = 0; i < 200 && !(await done()); i++) {
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
  }
}

function setup(client: FakeTroplineClientOptions) {
  TestBed.configureTestingModule({
    imports: [Host],
    providers: [provideTroplineTesting({ client: { analyses: ENGINE_ANALYSES, ...client } })],
  });
  const fixture = TestBed.createComponent(Host);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, fake: TestBed.inject(FakeTroplineClient), loader };
}

describe('BifurcationChart', () => {
  it('runs the sweep as a job and describes the maxima by regime', async () => {
    const { fixture, fake, loader } = setup({});
    const chart = await loader.getHarness(BifurcationChartHarness);
    await until(fixture, async () => (await chart.getSummary()).startsWith('Bifurcation'));
    expect(fake.calls.jobs).toEqual([{ path: '/sweeps', body: sweep }]);
    expect(await chart.isRunning()).toBe(false);
    expect(await chart.getSummary()).toMatch(
      /long-run maxima of .+ for 3 values of Handling time h of .+ from 0.4 to 0.6/,
    );
    await chart.toggleTable();
    expect(await chart.getTableRowCount()).toBe(3);
  });

  it('cancels the job when the reader presses cancel', async () => {
    const { fixture, fake, loader } = setup({ latencyMs: 50 });
    const chart = await loader.getHarness(BifurcationChartHarness);
    await until(fixture, () => chart.isRunning());
    await chart.cancel();
    await until(fixture, async () => fake.calls.cancelled.length > 0);
    expect(fake.calls.cancelled).toEqual(['fake-job-1']);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'The computation was cancelled.',
    );
  });

  it('shows the refusal when the sweep is not accepted', async () => {
    const { fixture, loader } = setup({});
    fixture.componentInstance.request.set({ ...sweep, steps: 1 });
    const chart = await loader.getHarness(BifurcationChartHarness);
    await until(fixture, async () => (await chart.getError()) !== null);
    expect(await chart.getError()).toContain('steps must be at least 2');
  });
});
