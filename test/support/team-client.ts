/**
 * A browser-like HTTP client for the team server, over real HTTP with Node's fetch: a cookie jar,
 * Angular's XSRF convention (the `XSRF-TOKEN` cookie copied into `X-XSRF-TOKEN` on writes), and
 * sign-in through the identity provider's own form — the whole authorization-code flow, as a
 * browser walks it. Used by the API tests and the load tool.
 */

export interface Answer<T = any> {
  status: number;
  body: T;
  headers: Headers;
  text: string;
}

export class TeamClient {
  /** Cookies by host:port then name (cookies are per host; ports kept apart for clarity here). */
  private readonly jar = new Map<string, Map<string, string>>();

  constructor(readonly baseUrl: string) {}

  cookie(name: string, url = this.baseUrl): string | undefined {
    return this.jar.get(new URL(url).host)?.get(name);
  }

  setCookie(name: string, value: string, url = this.baseUrl): void {
    const host = new URL(url).host;
    if (!this.jar.has(host)) this.jar.set(host, new Map());
    this.jar.get(host)!.set(name, value);
  }

  private remember(url: string, headers: Headers): void {
    const host = new URL(url).host;
    for (const line of headers.getSetCookie()) {
      const [pair, ...attrs] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (!this.jar.has(host)) this.jar.set(host, new Map());
      const expired = attrs.some((a) => /^\s*expires=Thu, 01 Jan 1970/i.test(a) || /^\s*max-age=0/i.test(a));
      if (expired || value === '') this.jar.get(host)!.delete(name);
      else this.jar.get(host)!.set(name, value);
    }
  }

  private cookieHeader(url: string): string | undefined {
    const cookies = this.jar.get(new URL(url).host);
    return cookies && cookies.size ? [...cookies].map(([k, v]) => `${k}=${v}`).join('; ') : undefined;
  }

  /** One request, no redirects followed; JSON bodies are sent and read as JSON. */
  async request<T = any>(method: string, path: string, options: { json?: unknown; body?: BodyInit; headers?: Record<string, string>; xsrf?: boolean } = {}): Promise<Answer<T>> {
    const url = new URL(path, this.baseUrl).toString();
    const headers: Record<string, string> = { ...(options.headers ?? {}) };
    const cookie = this.cookieHeader(url);
    if (cookie) headers.cookie = cookie;
    const unsafe = !['GET', 'HEAD', 'OPTIONS'].includes(method);
    const token = this.cookie('XSRF-TOKEN', url);
    if (unsafe && options.xsrf !== false && token) headers['x-xsrf-token'] = decodeURIComponent(token);
    let body = options.body;
    if (options.json !== undefined) {
      headers['content-type'] = 'application/json';
      body = JSON.stringify(options.json);
    }
    const res = await fetch(url, { method, headers, body, redirect: 'manual' });
    this.remember(url, res.headers);
    const text = await res.text();
    let parsed: unknown = text;
    if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text);
    return { status: res.status, body: parsed as T, headers: res.headers, text };
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, json?: unknown) {
    return this.request<T>('POST', path, { json: json ?? {} });
  }
  put<T = any>(path: string, json: unknown) {
    return this.request<T>('PUT', path, { json });
  }
  patch<T = any>(path: string, json: unknown) {
    return this.request<T>('PATCH', path, { json });
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path);
  }

  /** Follows redirects from `url` (absolute or relative) by GET, carrying cookies per host. */
  async follow(url: string, limit = 10): Promise<{ url: string; res: Answer }> {
    let current = new URL(url, this.baseUrl).toString();
    for (let i = 0; i < limit; i++) {
      const res = await this.absolute('GET', current);
      const location = res.headers.get('location');
      if (res.status < 300 || res.status >= 400 || !location) return { url: current, res };
      current = new URL(location, current).toString();
    }
    throw new Error(`more than ${limit} redirects from ${url}`);
  }

  /** A request to any absolute URL (the identity provider), with this jar. */
  async absolute(method: string, url: string, form?: Record<string, string>): Promise<Answer> {
    const headers: Record<string, string> = {};
    const cookie = this.cookieHeader(url);
    if (cookie) headers.cookie = cookie;
    let body: string | undefined;
    if (form) {
      headers['content-type'] = 'application/x-www-form-urlencoded';
      body = new URLSearchParams(form).toString();
    }
    const res = await fetch(url, { method, headers, body, redirect: 'manual' });
    this.remember(url, res.headers);
    const text = await res.text();
    return { status: res.status, body: text, headers: res.headers, text };
  }

  /**
   * Signs in as `email` through the provider's form, as a browser would: start at
   * `/auth/sign-in`, follow to the provider's page, post the form, follow the redirects back.
   * Returns where the browser landed (a path of the app).
   */
  async signIn(email: string, password: string, options: { next?: string; invite?: string } = {}): Promise<string> {
    const params = new URLSearchParams({ next: options.next ?? '/bench' });
    if (options.invite) params.set('invite', options.invite);
    const start = await this.follow(`/auth/sign-in?${params}`);
    if (start.res.status !== 200 || !/name="password"/.test(start.res.text)) throw new Error(`sign-in page not reached (${start.res.status} at ${start.url})`);
    const action = /<form[^>]*action="([^"]*)"/i.exec(start.res.text)?.[1]?.replace(/&amp;/g, '&');
    const posted = await this.absolute('POST', new URL(action || start.url, start.url).toString(), { email, password });
    const location = posted.headers.get('location');
    if (!location) throw new Error(`the provider refused ${email} (${posted.status})`);
    let current = new URL(location, start.url).toString();
    for (let i = 0; i < 10; i++) {
      const res = await this.absolute('GET', current);
      const next = res.headers.get('location');
      if (!next || res.status < 300 || res.status >= 400) break;
      const target = new URL(next, current);
      if (target.origin === new URL(this.baseUrl).origin && !target.pathname.startsWith('/auth/')) return `${target.pathname}${target.search}`;
      current = target.toString();
    }
    throw new Error(`sign-in as ${email} did not come back to the app`);
  }
}
