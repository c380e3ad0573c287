import {
  type ApplicationConfig,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { provideTropline } from '@tropline/widgets';
import type { RuntimeConfig } from '../runtime-config';
import { routes } from './app.routes';

/** The portal's providers: routing and the Tropline widgets bound to the portal's browser key. */
export function appConfig(runtime: RuntimeConfig): ApplicationConfig {
  return {
    providers: [
      provideBrowserGlobalErrorListeners(),
      provideZonelessChangeDetection(),
      provideRouter(routes, withComponentInputBinding()),
      provideTropline({ apiUrl: runtime.apiUrl, apiKey: runtime.apiKey }),
    ],
  };
}
