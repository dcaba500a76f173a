/**
 * The block library's pages, mounted by the app at `/library` (the current workspace) and at
 * `/w/:slug/library` (mail links point there: `/w/SLUG/library/CATEGORY/NAME/VERSION`).
 */
import type { Routes } from '@angular/router';

export const LIBRARY_ROUTES: Routes = [
  { path: '', title: 'Block library · Nodewright', loadComponent: () => import('./library-page').then((m) => m.LibraryPage) },
  { path: 'queue', title: 'Review queue · Block library · Nodewright', loadComponent: () => import('./review-queue-page').then((m) => m.ReviewQueuePage) },
  { path: ':category/:name', title: 'Block · Nodewright', loadComponent: () => import('./block-page').then((m) => m.BlockPage) },
  { path: ':category/:name/:version', title: 'Block · Nodewright', loadComponent: () => import('./block-page').then((m) => m.BlockPage) },
];
