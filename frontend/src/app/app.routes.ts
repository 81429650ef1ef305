import { Routes } from '@angular/router';

import { allowedTo, signedInGuard } from './session/access.guards';

export const routes: Routes = [
  {
    path: '',
    title: 'Network map · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./network-map/network-map.page').then((m) => m.NetworkMapPage),
  },
  {
    path: 'structures/:id',
    title: 'Structure · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./structures/structure.page').then((m) => m.StructurePage),
  },
  {
    path: 'girders/:id',
    title: 'Girder · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./girders/girder-editor.page').then((m) => m.GirderEditorPage),
  },
  {
    path: 'inspections/:id',
    title: 'Inspection · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./inspections/inspection.page').then((m) => m.InspectionPage),
  },
  {
    path: 'spans/:id/rate',
    title: 'Rate a span · Spanledger',
    canActivate: [signedInGuard],
    data: { opens: 'span' },
    loadComponent: () => import('./ratings/span-rating.page').then((m) => m.SpanRatingPage),
  },
  {
    path: 'ratings/:id',
    title: 'Rating · Spanledger',
    canActivate: [signedInGuard],
    data: { opens: 'rating' },
    loadComponent: () => import('./ratings/span-rating.page').then((m) => m.SpanRatingPage),
  },
  {
    path: 'reviews',
    title: 'Ratings to review · Spanledger',
    canActivate: [allowedTo('approveRatings')],
    loadComponent: () => import('./ratings/review-queue.page').then((m) => m.ReviewQueuePage),
  },
  // The history and the templates are for everyone signed in; the page offers the upload to roles that import (templatesUserMayImport in shared/src/imports/rights.ts).
  {
    path: 'imports',
    title: 'Imports · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./imports/imports.page').then((m) => m.ImportsPage),
  },
  {
    path: 'imports/:id',
    title: 'Import · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./imports/imports.page').then((m) => m.ImportsPage),
  },
  {
    path: 'my-role',
    title: 'What my role can do · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./access/my-role.page').then((m) => m.MyRolePage),
  },
  {
    path: 'register',
    title: 'Network register · Spanledger',
    canActivate: [allowedTo('exportRegister')],
    loadComponent: () => import('./network-register/network-register.page').then((m) => m.NetworkRegisterPage),
  },
  {
    path: 'sign-in',
    title: 'Sign in · Spanledger',
    loadComponent: () => import('./session/sign-in.page').then((m) => m.SignInPage),
  },
  {
    path: 'not-allowed',
    title: 'Not for your role · Spanledger',
    canActivate: [signedInGuard],
    loadComponent: () => import('./session/not-allowed.page').then((m) => m.NotAllowedPage),
  },
  { path: '**', redirectTo: '' },
];
