/**
 * One way for long-running tools to learn that they should stop: SIGINT, SIGTERM, SIGHUP, or
 * their parent process going away (then nobody would ever send the signal).
 */
export function onStopRequest(stop: (reason: string) => void): void {
  let asked = false;
  const once = (reason: string) => {
    if (asked) return;
    asked = true;
    stop(reason);
  };
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(signal, () => once(signal));
  const parent = process.ppid;
  setInterval(() => {
    if (process.ppid !== parent) once('parent exited');
  }, 500).unref();
}
