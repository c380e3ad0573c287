import { provideHttpClient, withFetch } from '@angular/common/http';
import { type EnvironmentProviders, makeEnvironmentProviders } from '@angular/core';
import { provideEchartsCore } from 'ngx-echarts';
import { loadTroplineEcharts } from './tropline-echarts';
import { defaultTroplineOptions, TROPLINE_OPTIONS, type TroplineOptions } from './tropline-options';
import {
  DEFAULT_TROPLINE_STRINGS,
  TROPLINE_STRINGS,
  type TroplineStrings,
} from './tropline-strings';

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
export function provideTropline(
  options: TroplineOptions & { readonly strings?: Partial<TroplineStrings> },
): EnvironmentProviders {
  if (!options.apiUrl) throw new Error('provideTropline: apiUrl is required');
  const { strings, ...rest } = options;
  return makeEnvironmentProviders([
    provideHttpClient(withFetch()),
    // ECharts loads with the first chart, not with the page.
    provideEchartsCore({ echarts: loadTroplineEcharts }),
    {
      provide: TROPLINE_OPTIONS,
      useValue: {
        ...defaultTroplineOptions(),
        ...rest,
        apiUrl: options.apiUrl.replace(/\/+$/, ''),
      },
    },
    { provide: TROPLINE_STRINGS, useValue: { ...DEFAULT_TROPLINE_STRINGS, ...strings } },
  ]);
}
