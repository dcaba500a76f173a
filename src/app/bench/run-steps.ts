/**
 * Runs the solver's stepped work (solver/run/steps.ts) in a worker without shutting out its
 * messages: after each slice of STEP_SLICE_MS it gives the event loop a turn — through a
 * MessageChannel, which a browser does not throttle as it does nested timers — and stops, with
 * no result, once `stop` says newer work is waiting.
 */
import type { Steps } from '../../../solver';
import { STEP_SLICE_MS } from './solver-protocol';

/** The result of `steps`, or undefined when `stop()` turned true at a slice's end. */
export async function runSteps<T>(steps: Steps<T>, stop: () => boolean, sliceMs = STEP_SLICE_MS): Promise<T | undefined> {
  let sliceStart = performance.now();
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
    if (performance.now() - sliceStart < sliceMs) continue;
    await turn();
    if (stop()) {
      steps.return(undefined as T);
      return undefined;
    }
    sliceStart = performance.now();
  }
}

/** Resolves after the messages already queued for this thread have been handled. */
function turn(): Promise<void> {
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    channel.port1.onmessage = () => {
      channel.port1.close();
      resolve();
    };
    channel.port2.postMessage(null);
  });
}
