/** A tiny cookie-keeping HTTP client for integration tests. */
export class ApiClient {
  cookies = new Map<string, string>();
  constructor(public readonly base: string) {}

  private cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const h: Record<string, string> = { ...headers };
    const c = this.cookieHeader();
    if (c) h.cookie = c;
    let payload: BodyInit | undefined;
    if (body instanceof FormData || typeof body === 'string') payload = body;
    else if (body !== undefined) {
      payload = JSON.stringify(body);
      h['content-type'] ??= 'application/json';
    }
    const r = await fetch(this.base + path, { method, headers: h, body: payload, redirect: 'manual' });
    for (const sc of r.headers.getSetCookie()) {
      const [pair] = sc.split(';');
      const i = pair.indexOf('=');
      const k = pair.slice(0, i).trim();
      const v = pair.slice(i + 1).trim();
      if (v === '' || /max-age=0/i.test(sc)) this.cookies.delete(k);
      else this.cookies.set(k, v);
    }
    return r;
  }

  async json<T = any>(method: string, path: string, body?: unknown, headers?: Record<string, string>) {
    const r = await this.request(method, path, body, headers);
    const text = await r.text();
    let data: any = null;
    try {
      data = text ? JSON.parse(text) : null;
    } catch {
      data = text;
    }
    return { status: r.status, data: data as T, headers: r.headers };
  }

  get = <T = any>(path: string) => this.json<T>('GET', path);
  post = <T = any>(path: string, body?: unknown) => this.json<T>('POST', path, body);
  patch = <T = any>(path: string, body?: unknown) => this.json<T>('PATCH', path, body);
  del = <T = any>(path: string) => this.json<T>('DELETE', path);

  async signIn(email: string, password = 'armilla-demo') {
    const r = await this.post('/api/auth/sign-in', { email, password });
    if (r.status !== 200) throw new Error(`sign-in ${email} → ${r.status} ${JSON.stringify(r.data)}`);
    return r;
  }
}

export const DEMO = {
  owner: 'owner@larkspur.example',
  editor: 'editor@larkspur.example',
  reviewer: 'reviewer@larkspur.example',
  viewer: 'viewer@larkspur.example',
  outsider: 'outsider@elsewhere.example',
  password: 'armilla-demo',
} as const;
