/**
 * Where the library's pages are. They are mounted twice — at `/library` (the current workspace)
 * and at `/w/:slug/library` (a named one, where mail links point) — so a page reads the slug from
 * wherever it sits in the route tree, and builds its links under the same base it was reached by.
 */
import { inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute } from '@angular/router';
import { combineLatest, map, of } from 'rxjs';

/**
 * A route parameter from the nearest route up the tree that has it (whatever the router's
 * inheritance strategy), as a signal. Call it where `inject()` works.
 */
export function routeParam(name: string): Signal<string | undefined> {
  const route = inject(ActivatedRoute);
  const maps = route.pathFromRoot.map((r) => r.paramMap);
  const found = (maps.length ? combineLatest(maps) : of([])).pipe(
    map((all) => {
      for (let i = all.length - 1; i >= 0; i--) {
        const v = all[i].get(name);
        if (v) return v;
      }
      return undefined;
    }),
  );
  return toSignal(found, { initialValue: undefined });
}

/** The library's base path: `/w/SLUG/library` when the address names a workspace, else `/library`. */
export function libraryBase(routeSlug: string | undefined): string {
  return routeSlug ? `/w/${encodeURIComponent(routeSlug)}/library` : '/library';
}

/** A block page under `base`, at a version when given: `/library/mirrors/wilson_npn/3`. */
export function blockLink(base: string, path: string, version?: number): string {
  return `${base}/${path}${version !== undefined ? `/${version}` : ''}`;
}

/** Where "Open in bench" goes: the bench opens the version's source as a new draft. */
export function benchQuery(path: string, version: number): { block: string } {
  return { block: `${path}@${version}` };
}
