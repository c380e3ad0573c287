import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { HASTINGS_POWELL_BENCHMARK, PROJECTION_CAUTIONS, type ChainModel } from '@tropline/core';
import {
  FakeTroplineClient,
  provideTroplineTesting,
  TrajectoryChartHarness,
} from '@tropline/widgets/testing';
import { ProjectionPanel } from './projection-panel';

@Component({
  imports: [ProjectionPanel],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-projection-panel
    [model]="model()"
    [initial]="initial"
    [horizon]="horizon()"
    [samples]="11"
  />`,
})
class Host {
  readonly model = signal<ChainModel>(HASTINGS_POWELL_BENCHMARK.model);
  readonly initial = { ...HASTINGS_POWELL_BENCHMARK.initial };
  readonly horizon = signal(10);
}

async function settle(fixture: { whenStable(): Promise<unknown> }) {
  // Debounce (0 ms here) and the fake client's timer each take a macrotask.
  for (let i = 0; i < 4; i++) {
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
  }
}

describe('ProjectionPanel', () => {
  function setup(options = {}) {
    TestBed.configureTestingModule({
      imports: [Host],
      providers: [provideTroplineTesting({ client: options })],
    });
    const fixture = TestBed.createComponent(Host);
    return { fixture, fake: TestBed.inject(FakeTroplineClient) };
  }

  it('projects the model and draws every level with the cautions', async () => {
    const { fixture, fake } = setup();
    await settle(fixture);
    expect(fake.requests).toHaveLength(1);
    expect(fake.requests[0]).toMatchObject({ horizon: 10, samples: 11 });
    const chart =
      await TestbedHarnessEnvironment.loader(fixture).getHarness(TrajectoryChartHarness);
    expect(await chart.getSummary()).toMatch(/^Trajectory of 3 food-chain levels over 10/);
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    for (const caution of PROJECTION_CAUTIONS) expect(text).toContain(caution);
  });

  it('sends one request for a burst of changes (debounced, newest wins)', async () => {
    const { fixture, fake } = setup();
    await settle(fixture);
    fixture.componentInstance.horizon.set(20);
    fixture.componentInstance.horizon.set(30);
    await settle(fixture);
    expect(fake.requests.map((r) => r.horizon)).toEqual([10, 30]);
  });

  it('shows the API’s refusal with its field errors', async () => {
    const { fixture } = setup({
      failWith: {
        status: 400,
        title: 'The request is not valid',
        message: '/horizon: horizon must be at most 100000 time units',
        fieldErrors: [
          { pointer: '/horizon', message: 'horizon must be at most 100000 time units' },
        ],
        retryable: false,
      },
    });
    await settle(fixture);
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('The request is not valid');
    expect(alert?.textContent).toContain('/horizon');
  });

  it('shows a field error of the API under the field its pointer names', async () => {
    const message = 'mortality must be at most 10 per day';
    const { fixture } = setup({
      failWith: {
        status: 400,
        title: 'The request is not valid',
        message: `/model/levels/1/mortality: ${message}`,
        fieldErrors: [{ pointer: '/model/levels/1/mortality', message }],
        retryable: false,
      },
    });
    await settle(fixture);
    const root = fixture.nativeElement as HTMLElement;
    const error = root.querySelector('[id$="-levels-1-mortality-error"]');
    expect(error?.textContent).toMatch(/at most 10 per day/); // in the form's own words
  });
});
