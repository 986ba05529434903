// A small HTTP client for the API suites: signs in through next-auth's real credentials flow and
// keeps the session cookie, like a browser would.
export const appUrl = () => process.env.DENUDATA_APP_URL ?? `http://127.0.0.1:${process.env.DENUDATA_TEST_PORT ?? '3100'}`;

export type ApiResponse<T = any> = { status: number; body: T; headers: Headers };

export class ApiClient {
  private cookies = new Map<string, string>();

  /** A client of the app at `origin` (default: the test app); `headers` go with every request (e.g. X-Forwarded-For). */
  constructor(
    private readonly origin: string = appUrl(),
    readonly headers: Record<string, string> = {},
  ) {}

  private url(path: string) {
    return `${this.origin}${path}`;
  }

  cookieHeader() {
    return [...this.cookies.entries()].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keepCookies(response: Response) {
    for (const line of response.headers.getSetCookie()) {
      const pair = line.split(';', 1)[0] ?? '';
      const index = pair.indexOf('=');
      this.cookies.set(pair.slice(0, index), pair.slice(index + 1));
    }
  }

  async request<T = any>(method: string, path: string, body?: unknown, init: { raw?: string; headers?: Record<string, string> } = {}): Promise<ApiResponse<T>> {
    const response = await fetch(this.url(path), {
      method,
      redirect: 'manual',
      headers: {
        ...this.headers,
        ...(body !== undefined || init.raw !== undefined ? { 'content-type': 'application/json' } : {}),
        ...(this.cookies.size ? { cookie: this.cookieHeader() } : {}),
        ...init.headers,
      },
      body: init.raw ?? (body === undefined ? undefined : JSON.stringify(body)),
    });
    this.keepCookies(response);
    const text = await response.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // not JSON: keep the text
    }
    return { status: response.status, body: parsed as T, headers: response.headers };
  }

  /** A multipart/form-data request (uploads); fetch sets the boundary. */
  async multipart<T = any>(path: string, form: FormData, method = 'POST'): Promise<ApiResponse<T>> {
    const response = await fetch(`${appUrl()}${path}`, {
      method,
      redirect: 'manual',
      headers: this.cookies.size ? { cookie: this.cookieHeader() } : {},
      body: form,
    });
    this.keepCookies(response);
    const text = await response.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // not JSON: keep the text
    }
    return { status: response.status, body: parsed as T, headers: response.headers };
  }

  /** The raw bytes of a GET (downloads). */
  async bytes(path: string): Promise<{ status: number; bytes: Buffer; headers: Headers }> {
    const response = await fetch(`${appUrl()}${path}`, { headers: this.cookies.size ? { cookie: this.cookieHeader() } : {} });
    return { status: response.status, bytes: Buffer.from(await response.arrayBuffer()), headers: response.headers };
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown) {
    return this.request<T>('POST', path, body ?? {});
  }
  put<T = any>(path: string, body?: unknown) {
    return this.request<T>('PUT', path, body);
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, body);
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path);
  }

  /** Signs in with e-mail and password; true when next-auth set a session cookie. */
  async signIn(email: string, password: string): Promise<boolean> {
    return (await this.signInAttempt(email, password)).signedIn;
  }

  /** A sign-in attempt with its answer (status, body, Retry-After), for the rate-limit suites. */
  async signInAttempt(email: string, password: string): Promise<{ signedIn: boolean; status: number; body: any; retryAfter: string | null }> {
    const csrf = await this.get<{ csrfToken: string }>('/api/auth/csrf');
    const response = await fetch(this.url('/api/auth/callback/credentials'), {
      method: 'POST',
      redirect: 'manual',
      headers: { ...this.headers, 'content-type': 'application/x-www-form-urlencoded', cookie: this.cookieHeader() },
      body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, email, password, json: 'true' }).toString(),
    });
    this.keepCookies(response);
    const text = await response.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // not JSON
    }
    return { signedIn: [...this.cookies.keys()].some((k) => k.includes('session-token')), status: response.status, body, retryAfter: response.headers.get('retry-after') };
  }
}

export const DEMO_PASSWORD = 'demo-password';

export async function signedInAs(role: 'owner' | 'editor' | 'reviewer' | 'viewer'): Promise<ApiClient> {
  const client = new ApiClient();
  const ok = await client.signIn(`${role}@demo.test`, DEMO_PASSWORD);
  if (!ok) throw new Error(`could not sign in as ${role}@demo.test`);
  return client;
}

/** A fresh account (and team of its own) with a unique address. */
export async function newAccount(prefix = 'person'): Promise<{ client: ApiClient; email: string; id: string }> {
  const client = new ApiClient();
  const email = `${prefix}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@example.test`;
  const created = await client.post('/api/users', { email, password: 'long-enough-password', name: `Test ${prefix}` });
  if (created.status !== 201) throw new Error(`sign-up failed: ${JSON.stringify(created.body)}`);
  await client.signIn(email, 'long-enough-password');
  return { client, email, id: created.body.user.id };
}
