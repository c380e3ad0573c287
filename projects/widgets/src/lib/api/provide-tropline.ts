import { provideHttpClient, withFetch } from '@angular/common/http';
import { type EnvironmentProviders, makeEnvironmentProviders } from '@angular/core';
import { provideEchartsCore } from 'ngx-echarts';
import { troplineEcharts } from './tropline-echarts';
import { defaultTroplineOptions, TROPLINE_OPTIONS, type TroplineOptions } from './tropline-options';

/**
 * Everything a host app provides to use the widgets: the API's address and key, HttpClient and
 * the trimmed ECharts build.
 *
 * ```ts
 * bootstrapApplication(App, {
 *   providers: [provideTropline({ apiUrl: '/api/v1', apiKey: 'trb_…' })],
 * });
 * ```
 */
export function provideTropline(options: TroplineOptions): EnvironmentProviders {
  if (!options.apiUrl) throw new Error('provideTropline: apiUrl is required');
  return makeEnvironmentProviders([
    provideHttpClient(withFetch()),
    provideEchartsCore({ echarts: troplineEcharts }),
    {
      provide: TROPLINE_OPTIONS,
      useValue: {
        ...defaultTroplineOptions(),
        ...options,
        apiUrl: options.apiUrl.replace(/\/+$/, ''),
      },
    },
  ]);
}
