/**
 * One HTTP request with node:http over a keep-alive agent. The clients share the machine's two
 * cores with the server they measure; fetch spends several times more CPU per request than this.
 */
import http from 'node:http';

// The server closes a connection idle for 5 s; one it closes just as a request goes out on it is
// reset (ECONNRESET), which a browser would quietly retry but here counts as a network error. So
// idle connections are dropped after 4 s, before the server would, and each phase starts with none.
const agent = new http.Agent({ keepAlive: true, maxSockets: Infinity, timeout: 4000 });

export interface Reply {
  status: number;
  headers: http.IncomingHttpHeaders;
  text: string;
}

/** Rejects with an error named `TimeoutError` past `timeoutMs`, else as node:http does. */
export function request(url: string, o: { method: string; headers: Record<string, string>; body?: string; timeoutMs: number }): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const headers = o.body === undefined ? o.headers : { ...o.headers, 'content-length': String(Buffer.byteLength(o.body)) };
    const req = http.request(url, { method: o.method, headers, agent }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        clearTimeout(timer);
        resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString('utf8') });
      });
      res.on('error', fail);
    });
    function fail(err: Error) {
      clearTimeout(timer);
      reject(err);
    }
    const timer = setTimeout(() => req.destroy(Object.assign(new Error(`no answer within ${o.timeoutMs} ms`), { name: 'TimeoutError' })), o.timeoutMs);
    req.on('error', fail);
    req.end(o.body);
  });
}

/** Closes idle connections (between phases they have sat for seconds). */
export function dropIdleConnections(): void {
  for (const sockets of Object.values(agent.freeSockets)) for (const s of sockets ?? []) s.destroy();
}

/** Cuts every connection (Ctrl-C): requests in flight fail at once. */
export function dropAllConnections(): void {
  dropIdleConnections();
  for (const sockets of Object.values(agent.sockets)) for (const s of sockets ?? []) s.destroy();
}
