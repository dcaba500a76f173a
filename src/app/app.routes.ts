import type { Routes } from '@angular/router';
import { requireSignIn } from './core/session';

export const routes: Routes = [
  { path: '', pathMatch: 'full', title: 'Nodewright · an analog bench in the browser', loadComponent: () => import('./home/home-page').then((m) => m.HomePage) },
  { path: 'bench', title: 'Bench · Nodewright', loadComponent: () => import('./bench/bench-page').then((m) => m.BenchPage) },
  { path: 'reference', title: 'Language reference · Nodewright', loadComponent: () => import('./reference/reference-page').then((m) => m.ReferencePage) },
  // The block library: the current workspace's at /library, a named one at /w/:slug/library (mail links).
  { path: 'library', title: 'Block library · Nodewright', loadChildren: () => import('./library/library.routes').then((m) => m.LIBRARY_ROUTES) },
  { path: 'w/:slug/library', title: 'Block library · Nodewright', canActivate: [requireSignIn], loadChildren: () => import('./library/library.routes').then((m) => m.LIBRARY_ROUTES) },
  { path: 'netlists', title: 'Team netlists · Nodewright', canActivate: [requireSignIn], loadComponent: () => import('./netlists/netlists-page').then((m) => m.NetlistsPage) },
  { path: 'w/:slug/netlists', title: 'Team netlists · Nodewright', canActivate: [requireSignIn], loadComponent: () => import('./netlists/netlists-page').then((m) => m.NetlistsPage) },
  { path: 'netlists/:id/revisions', title: 'Revisions · Nodewright', canActivate: [requireSignIn], loadComponent: () => import('./netlists/revisions-page').then((m) => m.RevisionsPage) },
  { path: 'w/:slug/admin', title: 'Members · Nodewright', canActivate: [requireSignIn], loadComponent: () => import('./admin/admin-page').then((m) => m.AdminPage) },
  { path: 'join/:token', title: 'Join a team · Nodewright', loadComponent: () => import('./core/join-page').then((m) => m.JoinPage) },
  { path: 's/:token', title: 'Shared netlist · Nodewright', loadComponent: () => import('./shares/shared-page').then((m) => m.SharedPage) },
  { path: 'sign-in', title: 'Sign in · Nodewright', loadComponent: () => import('./core/sign-in-page').then((m) => m.SignInPage) },
  { path: '**', title: 'Not found · Nodewright', loadComponent: () => import('./core/not-found-page').then((m) => m.NotFoundPage) },
];
