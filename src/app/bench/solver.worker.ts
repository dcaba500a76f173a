/**
 * The solver worker: netlist text in, the §5 result and the names it defines out.
 * The bench terminates this worker when its text goes stale, so each message is solved to the end.
 */
import { solveNetlist } from '../../../solver';
import { namesOf } from './netlist-names';
import { SeedLibrary } from './seed-library';
import type { SolveReply, SolveRequest, WorkerMessage } from './solver-protocol';

/** The worker's global scope, typed by what is used (the app compiles against the DOM library). */
interface WorkerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<SolveRequest>) => void): void;
  postMessage(message: WorkerMessage): void;
}
const scope = self as unknown as WorkerScope;

/** The seed block library shipped with the app, beside the worker script. */
const library = new SeedLibrary(new URL('library/', self.location.href));

scope.addEventListener('message', async (event: MessageEvent<SolveRequest>) => {
  const request = event.data;
  if (request?.type !== 'solve') return;
  const started = performance.now();
  await library.preload(request.text);
  const result = solveNetlist(request.text, { resolveUse: library.resolve });
  const reply: SolveReply = { type: 'solved', id: request.id, result, text: request.text, names: namesOf(request.text, library.resolve), solveMs: performance.now() - started };
  scope.postMessage(reply);
});

scope.postMessage({ type: 'ready' });
