import type { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Service status · Tropline console',
    loadComponent: () => import('./status/status-page').then((m) => m.StatusPage),
  },
  { path: '**', redirectTo: '' },
];
