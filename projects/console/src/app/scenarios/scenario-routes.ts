import type { Routes } from '@angular/router';
import {
  defaultTroplineOptions,
  loadTroplineEcharts,
  TroplineClient,
  TROPLINE_OPTIONS,
} from '@tropline/widgets';
import { provideEchartsCore } from 'ngx-echarts';
import { requireAction } from '../session/session-guards';
import type { ScenarioEditPage } from './scenario-edit-page';

const title = (page: string) => `${page} · Tropline console`;

/** Where the widgets compute for a signed-in member: the session's compute routes. */
export const CONSOLE_COMPUTE_URL = '/api/v1/console/compute';

/**
 * The scenario pages, loaded together on first visit. The widgets' charts load the trimmed
 * ECharts build on first use; only that is provided, not all of provideTropline(), whose own
 * HttpClient would bypass the console's session interceptor. The widgets' client is provided
 * here again so it reads these options: no key, the member's session (the interceptor adds the
 * tenant and CSRF headers) on `/console/compute`, which the role matrix guards.
 */
export const SCENARIO_ROUTES: Routes = [
  {
    path: '',
    providers: [
      provideEchartsCore({ echarts: loadTroplineEcharts }),
      {
        provide: TROPLINE_OPTIONS,
        useValue: { ...defaultTroplineOptions(), apiUrl: CONSOLE_COMPUTE_URL },
      },
      TroplineClient,
    ],
    children: [
      {
        path: '',
        pathMatch: 'full',
        title: title('Scenarios'),
        loadComponent: () => import('./scenarios-page').then((m) => m.ScenariosPage),
      },
      {
        path: 'new',
        title: title('New scenario'),
        canActivate: [requireAction('scenarios:write')],
        loadComponent: () => import('./new-scenario-page').then((m) => m.NewScenarioPage),
      },
      {
        path: ':id',
        title: title('Scenario'),
        loadComponent: () => import('./scenario-page').then((m) => m.ScenarioPage),
      },
      {
        path: ':id/edit',
        title: title('Edit scenario'),
        canActivate: [requireAction('scenarios:write')],
        canDeactivate: [(page: ScenarioEditPage) => page.canLeave()],
        loadComponent: () => import('./scenario-edit-page').then((m) => m.ScenarioEditPage),
      },
      {
        path: ':id/compare',
        title: title('Compare versions'),
        loadComponent: () =>
          import('./version-comparison-page').then((m) => m.VersionComparisonPage),
      },
    ],
  },
];
