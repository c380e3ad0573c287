import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app.config';
import { loadRuntimeConfig } from './runtime-config';

loadRuntimeConfig()
  .then((runtime) => bootstrapApplication(App, appConfig(runtime)))
  .catch((err: unknown) => {
    console.error(err);
    document.body.textContent = 'This page could not start: ' + String(err);
  });
