import type { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Larchmere Lakes & Uplands Authority',
    loadComponent: () => import('./pages/home-page').then((m) => m.HomePage),
  },
  { path: '**', redirectTo: '' },
];
