import type { Routes } from '@angular/router';
import { loadTroplineEcharts } from '@tropline/widgets';
import { provideEchartsCore } from 'ngx-echarts';
import { requireAction } from '../session/session-guards';

const title = (page: string) => `${page} · Tropline console`;

/**
 * The scenario pages, loaded together on first visit. The widgets' charts load the trimmed
 * ECharts build on first use; only that is provided, not all of provideTropline(), whose own
 * HttpClient would bypass the console's session interceptor.
 */
export const SCENARIO_ROUTES: Routes = [
  {
    path: '',
    providers: [provideEchartsCore({ echarts: loadTroplineEcharts })],
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
    ],
  },
];
