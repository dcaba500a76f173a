import type { Routes } from '@angular/router';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'bench' },
  { path: 'bench', title: 'Bench · Nodewright', loadComponent: () => import('./bench/bench-page').then((m) => m.BenchPage) },
  { path: 'library', title: 'Block library · Nodewright', loadComponent: () => import('./library/library-page').then((m) => m.LibraryPage) },
  { path: 'sign-in', title: 'Sign in · Nodewright', loadComponent: () => import('./core/sign-in-page').then((m) => m.SignInPage) },
  { path: '**', title: 'Not found · Nodewright', loadComponent: () => import('./core/not-found-page').then((m) => m.NotFoundPage) },
];
