import { inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { LAKE_DEMO, withParameter } from '@tropline/core';
import { TroplineClient } from '@tropline/widgets';
import { provideTroplineTesting, TrajectoryChartHarness } from '@tropline/widgets/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { of } from 'rxjs';
import {
  BRACKENLOW_MERE,
  PublishedScenarioApi,
  type PublishedScenario,
  type PublishedState,
} from '../common/published';
import { whatIfChanges } from '../../../../elements/src/published-scenario';
import { HomePage } from './home-page';

/** The mere as the API would serve it (the demo seed's shape, invented numbers). */
const MERE: PublishedScenario = {
  publicId: BRACKENLOW_MERE,
  version: 1,
  publishedAt: '2025-01-01T00:00:00.000Z',
  name: LAKE_DEMO.title,
  description: LAKE_DEMO.description,
  location: 'Brackenlow Mere (invented)',
  model: LAKE_DEMO.model,
  initial: { ...LAKE_DEMO.initial },
  horizon: 104,
  publicParameters: [{ pointer: '/levels/2/mortality', min: 0.01, max: 0.05, label: 'Perch' }],
};

describe('HomePage', () => {
  it('projects the published mere through its published route, for screen readers too', async () => {
    const sent: { route: string; publicId: string; changes: unknown }[] = [];
    TestBed.configureTestingModule({
      imports: [HomePage],
      providers: [
        provideTroplineTesting(),
        provideRouter([]),
        {
          provide: PublishedScenarioApi,
          // Loads the mere above; computes with the fake client the published model with the
          // what-if applied, recording what each published route would have been sent.
          useFactory: () => {
            const fake = inject(TroplineClient);
            const whatIf = (route: string, s: PublishedScenario, m: PublishedScenario['model']) => {
              const changes = whatIfChanges(s, m);
              sent.push({ route, publicId: s.publicId, changes });
              return changes.reduce((m, c) => withParameter(m, c.pointer, c.value), s.model);
            };
            return {
              load: (id: string) =>
                of<PublishedState>({ kind: 'ready', scenario: { ...MERE, publicId: id } }),
              project: (s: PublishedScenario, r: { model: PublishedScenario['model'] }) =>
                fake.project({
                  model: whatIf('projections', s, r.model),
                  initial: s.initial,
                  horizon: s.horizon,
                }),
              equilibria: (s: PublishedScenario, r: { model: PublishedScenario['model'] }) =>
                fake.equilibria({ model: whatIf('equilibria', s, r.model) }),
              regime: (s: PublishedScenario, r: { model: PublishedScenario['model'] }) =>
                fake.regime({ model: whatIf('regimes', s, r.model), initial: s.initial }),
            };
          },
        },
      ],
    });
    const fixture = TestBed.createComponent(HomePage);
    for (let i = 0; i < 4; i++) {
      await new Promise((r) => setTimeout(r, 0));
      await fixture.whenStable();
    }
    const chart =
      await TestbedHarnessEnvironment.loader(fixture).getHarness(TrajectoryChartHarness);
    expect(await chart.getSummary()).toContain('Water flea (Daphnia pulex) ranges from');
    // The panel's projection, equilibria and regime all went to the published routes.
    expect(sent).toHaveLength(3);
    expect(sent).toEqual(
      expect.arrayContaining(
        ['projections', 'equilibria', 'regimes'].map((route) => ({
          route,
          publicId: BRACKENLOW_MERE,
          changes: [],
        })),
      ),
    );
    expect(fixture.nativeElement.textContent).toContain('The next 104 weeks');
  });
});
