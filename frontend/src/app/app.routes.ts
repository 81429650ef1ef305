import { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Network map · Spanledger',
    loadComponent: () => import('./network-map/network-map.page').then((m) => m.NetworkMapPage),
  },
  { path: '**', redirectTo: '' },
];
