import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { UPLAND_DEMO } from '@tropline/core';
import {
  FakeTroplineClient,
  provideTroplineTesting,
  ScenarioComparisonHarness,
} from '@tropline/widgets/testing';
import { ENGINE_ANALYSES } from '../../../testing/src/engine-analyses';
import type { ComparisonRequest } from '../api/analysis-types';
import { ScenarioComparison } from './scenario-comparison';

const { model, initial } = UPLAND_DEMO;
const top = model.levels.at(-1)!.id;
const request: ComparisonRequest = {
  model,
  initial,
  horizon: 30,
  window: 10,
  samples: 31,
  regimeTransient: 200,
  regimeWindow: 200,
  scenarios: [{ name: 'No predator', changes: [{ pointer: `/initial/${top}`, value: 0 }] }],
};

@Component({
  imports: [ScenarioComparison],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-scenario-comparison [model]="model" [request]="request" />`,
})
class Host {
  readonly model = model;
  readonly request = request;
}

describe('ScenarioComparison', () => {
  it('runs the comparison and highlights the large differences from the baseline', async () => {
    TestBed.configureTestingModule({
      imports: [Host],
      providers: [provideTroplineTesting({ client: { analyses: ENGINE_ANALYSES } })],
    });
    const fixture = TestBed.createComponent(Host);
    const harness =
      await TestbedHarnessEnvironment.loader(fixture).getHarness(ScenarioComparisonHarness);
    for (let i = 0; i < 200 && (await harness.getScenarioNames()).length === 0; i++) {
      await new Promise((r) => setTimeout(r, 0));
      await fixture.whenStable();
    }
    expect(TestBed.inject(FakeTroplineClient).calls.jobs[0]!.path).toBe('/comparisons');
    expect(await harness.getScenarioNames()).toEqual(['baseline', 'No predator']);
    const notable = await harness.getNotableCells();
    expect(notable.length).toBeGreaterThan(0);
    expect(notable.every((t) => /[▲▼]|never|\d/.test(t))).toBe(true);
    expect(await harness.getSummary()).toContain('one chart for each of 2 scenarios');
  });
});
