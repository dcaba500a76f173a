/**
 * A library version's whole source (its block and the fixture that solves it), for "Open in
 * bench": the signed-in workspace's library first, then the seed library shipped with the app.
 */
import { DOCUMENT } from '@angular/common';
import { inject, Injectable } from '@angular/core';
import { Session } from '../core/session';
import { apiErrorOf } from '../core/team-api';
import { LibraryApi } from '../library/library-api';

export type BlockSourceAnswer = { ok: true; text: string } | { ok: false; message: string };

/** `category/name@N`. */
const BLOCK_REF = /^([a-z][a-z0-9_]*\/[a-z][a-z0-9_]*)@([1-9]\d{0,5})$/;

@Injectable({ providedIn: 'root' })
export class BlockSources {
  private readonly session = inject(Session);
  private readonly api = inject(LibraryApi);
  private readonly base = inject(DOCUMENT).baseURI;

  /** The source of `ref` (`category/name@N`), or a sentence saying why it cannot be had. */
  async read(ref: string): Promise<BlockSourceAnswer> {
    const m = BLOCK_REF.exec(ref);
    if (!m) return { ok: false, message: `“${ref.slice(0, 80)}” is not a library version: it reads category/name@N, e.g. mirrors/wilson_npn@3.` };
    const [, path, digits] = m;
    const version = Number(digits);
    await this.session.load();
    const slug = this.session.workspace()?.slug;
    let offline = false;
    if (slug) {
      try {
        return { ok: true, text: (await this.api.version(slug, path, version)).source };
      } catch (err) {
        const e = apiErrorOf(err);
        if (e.status === 0 || e.status >= 500) offline = true;
        else if (e.status !== 404) return { ok: false, message: `${ref} could not be opened: ${e.message}` };
      }
    }
    try {
      const res = await fetch(new URL(`library/${path}@${version}.nwl`, this.base));
      if (res.ok) return { ok: true, text: await res.text() };
    } catch {
      offline = true;
    }
    return {
      ok: false,
      message: offline ? `${ref} could not be fetched: the server cannot be reached. Open it again when it is back.` : `The library has no ${ref}${slug ? '' : ' among the seed blocks (sign in for your team’s library)'}.`,
    };
  }
}
