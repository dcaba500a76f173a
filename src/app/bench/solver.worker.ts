/**
 * The solver worker: netlist text in; out, from the solver's one parse of it, the §5 result, the
 * names it defines and its measure and check lines — in two stages when the text asks for
 * analyses that re-solve the circuit many times: everything else first (`pending`), then the
 * whole result (`completed`), run in slices and dropped when newer text arrives meanwhile.
 *
 * Requests that wait are coalesced: when several arrive while the worker is busy (or before its
 * module has loaded), only the newest is solved and the older ones get no reply — the bench
 * shows only the newest text's result anyway. A solve, once started, runs to the end; the bench
 * terminates this worker when that is not worth waiting for.
 */
import { readBlockDocs, type OutlineUse } from '../../../solver';
import { openBlockCache } from './block-cache';
import { LibraryResolver } from './library-resolver';
import { runSteps } from './run-steps';
import { stagedSolveReply } from './solve-reply';
import type { SolveRequest, UsedBlock, WorkerMessage } from './solver-protocol';

/** The worker's global scope, typed by what is used (the app compiles against the DOM library). */
interface WorkerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<SolveRequest>) => void): void;
  postMessage(message: WorkerMessage): void;
}
const scope = self as unknown as WorkerScope;

/** The team library through the API, this browser's copies, and the seed library shipped beside the worker script. */
const library = new LibraryResolver(new URL('library/', self.location.href), new URL('/api/', self.location.href), openBlockCache());

/** The newest request not started yet. */
let waiting: SolveRequest | undefined;
let draining = false;

scope.addEventListener('message', (event: MessageEvent<SolveRequest>) => {
  if (event.data?.type !== 'solve') return;
  waiting = event.data;
  if (!draining) {
    draining = true;
    // A task later, so that requests already queued behind this one are seen first.
    setTimeout(() => void drain(), 0);
  }
});

/** Solves the newest waiting request, then the newest of any that came meanwhile. */
async function drain(): Promise<void> {
  while (waiting) {
    const request = waiting;
    waiting = undefined;
    const started = performance.now();
    const context = request.library ?? {};
    // `analyze mismatch` is left out and reported: the Mismatch tab runs it over its own workers.
    // The sweeps and sensitivity come second, so the rest is painted without waiting for them.
    const staged = await library.solveWith(context, (resolveUse) => stagedSolveReply(request.id, request.text, { resolveUse, describeUse: usedBlock, library: context }, true), () => !!waiting);
    if (!staged) continue; // superseded while its library blocks were fetched
    // The bench's guess of the next solve's time counts the library fetches too.
    scope.postMessage({ ...staged.reply, solveMs: performance.now() - started });
    await new Promise((resolve) => setTimeout(resolve, 0)); // let requests sent during the solve arrive
    if (staged.finishSteps && !waiting) {
      const second = performance.now();
      // In slices, dropped for newer text: the bench need not terminate this worker to move on.
      const result = await runSteps(staged.finishSteps(), () => !!waiting);
      if (result) scope.postMessage({ type: 'completed', id: request.id, result, solveMs: performance.now() - second });
      else scope.postMessage({ type: 'dropped', id: request.id });
      await new Promise((resolve) => setTimeout(resolve, 0));
    }
  }
  draining = false;
}

/** One of the text's own `use` lines with what the resolver found for it. */
function usedBlock({ path, version, line }: OutlineUse): UsedBlock {
  const block = library.lookup(path, version);
  if (!block) return { line, path, version, docs: [] };
  return { line, path, version, origin: block.origin, state: block.state, newestVetted: block.newestVetted, docs: docsOf(block.source) };
}

/** Block docs by source: a source is read once per worker (sources of a version never change). */
const docsBySource = new Map<string, ReturnType<typeof readBlockDocs>>();
function docsOf(source: string): ReturnType<typeof readBlockDocs> {
  let docs = docsBySource.get(source);
  if (!docs) {
    docs = readBlockDocs(source);
    if (docsBySource.size > 256) docsBySource.clear();
    docsBySource.set(source, docs);
  }
  return docs;
}

scope.postMessage({ type: 'ready' });
