import type { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Living waters — Larchmere Lakes & Uplands Authority',
    loadComponent: () => import('./pages/home-page').then((m) => m.HomePage),
  },
  {
    path: 'harvest',
    title: 'Deer culls compared — Larchmere Lakes & Uplands Authority',
    loadComponent: () => import('./pages/harvest-page').then((m) => m.HarvestPage),
  },
  {
    path: 'long-run',
    title: 'In the long run — Larchmere Lakes & Uplands Authority',
    loadComponent: () => import('./pages/long-run-page').then((m) => m.LongRunPage),
  },
  { path: '**', redirectTo: '' },
];
