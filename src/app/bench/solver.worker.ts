/**
 * The solver worker: netlist text in, the §5 result and the names it defines out.
 * The bench terminates this worker when its text goes stale, so each message is solved to the end.
 */
import { solveNetlist } from '../../../solver';
import { namesOf } from './netlist-names';
import type { SolveReply, SolveRequest, WorkerMessage } from './solver-protocol';

/** The worker's global scope, typed by what is used (the app compiles against the DOM library). */
interface WorkerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<SolveRequest>) => void): void;
  postMessage(message: WorkerMessage): void;
}
const scope = self as unknown as WorkerScope;

/** The bench does not reach the team library yet: say so at the `use` line, with a way on. */
const benchUse = (path: string, version: number) => ({
  ok: false as const,
  message: `\`${path}@${version}\` cannot be used in the bench yet: the team library is not connected in this version.`,
  hint: 'paste the block definition (block … end) into the netlist, or solve the file with `npm run solve`, which reads library/',
});

scope.addEventListener('message', (event: MessageEvent<SolveRequest>) => {
  const request = event.data;
  if (request?.type !== 'solve') return;
  const started = performance.now();
  const result = solveNetlist(request.text, { resolveUse: benchUse });
  const reply: SolveReply = { type: 'solved', id: request.id, result, text: request.text, names: namesOf(request.text), solveMs: performance.now() - started };
  scope.postMessage(reply);
});

scope.postMessage({ type: 'ready' });
