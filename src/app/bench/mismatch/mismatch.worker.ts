/**
 * A mismatch worker: chunks of an `analyze mismatch` in, their samples out (see mismatch-pool.ts).
 * It resolves `use` lines exactly as the solver worker does (the same LibraryResolver with the
 * context the solver worker had for the text), so its circuit is the one the live solve saw.
 * The pool sends a worker one chunk at a time.
 */
import { openBlockCache } from '../block-cache';
import { LibraryResolver } from '../library-resolver';
import { ChunkSolver } from './mismatch-chunk';
import type { ChunkReply, ChunkRequest } from './mismatch-protocol';

/** The worker's global scope, typed by what is used (the app compiles against the DOM library). */
interface WorkerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<ChunkRequest>) => void): void;
  postMessage(message: ChunkReply): void;
}
const scope = self as unknown as WorkerScope;

// The worker script sits beside the solver worker's, so `library/` is the same seed library.
const library = new LibraryResolver(new URL('library/', self.location.href), new URL('/api/', self.location.href), openBlockCache());
const solver = new ChunkSolver();

scope.addEventListener('message', (event: MessageEvent<ChunkRequest>) => {
  const chunk = event.data;
  if (chunk?.type !== 'chunk') return;
  void (async () => {
    if (!solver.knows(chunk)) await library.preload(chunk.text, chunk.library);
    scope.postMessage(solver.answer(chunk, library.resolve));
  })();
});
