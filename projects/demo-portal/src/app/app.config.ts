import {
  type ApplicationConfig,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { provideTropline } from '@tropline/widgets';
import type { RuntimeConfig } from '../runtime-config';
import { PublishedScenarioApi } from './common/published';
import { routes } from './app.routes';

/**
 * The portal's providers: routing, the Tropline widgets bound to the portal's browser key, and
 * the reader of the published scenarios its pages show (same API, same key).
 */
export function appConfig(runtime: RuntimeConfig): ApplicationConfig {
  return {
    providers: [
      provideBrowserGlobalErrorListeners(),
      provideZonelessChangeDetection(),
      provideRouter(routes, withComponentInputBinding()),
      provideTropline({ apiUrl: runtime.apiUrl, apiKey: runtime.apiKey }),
      PublishedScenarioApi,
    ],
  };
}
