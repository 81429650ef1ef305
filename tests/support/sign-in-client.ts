import { decodeRedirectRequest, type AuthnRequest } from '../../scripts/lib/local-identity-provider/authn-request';

export interface ClientResponse {
  readonly status: number;
  readonly location: string | null;
  readonly text: string;
  /** The body as it came, for images and other files. */
  readonly bytes: Buffer;
  readonly headers: Headers;
}

/** Reads the value of a hidden form field from an HTML page. */
export function formField(html: string, name: string): string | null {
  const match = new RegExp(`name="${name}" value="([^"]*)"`).exec(html);
  return match ? (match[1] as string).replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&') : null;
}

/**
 * Talks to Spanledger the way a browser does: keeps its cookies, follows nothing by itself, and
 * echoes the XSRF-TOKEN cookie in the X-XSRF-TOKEN header as the browser app does.
 */
export class SignInClient {
  private readonly cookies = new Map<string, string>();

  constructor(private readonly appUrl: string) {}

  cookie(name: string): string | undefined {
    return this.cookies.get(name);
  }

  setCookie(name: string, value: string): void {
    this.cookies.set(name, value);
  }

  async request(
    pathOrUrl: string,
    init: { method?: string; form?: Record<string, string>; json?: unknown; multipart?: FormData; xsrf?: boolean } = {},
  ): Promise<ClientResponse> {
    const url = pathOrUrl.startsWith('http') ? pathOrUrl : `${this.appUrl}${pathOrUrl}`;
    const headers: Record<string, string> = {};
    const ownSite = url.startsWith(this.appUrl);
    if (ownSite && this.cookies.size > 0) headers['cookie'] = [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ');
    const xsrfToken = this.cookies.get('XSRF-TOKEN');
    if (ownSite && init.xsrf !== false && xsrfToken) headers['x-xsrf-token'] = decodeURIComponent(xsrfToken);
    if (init.form) headers['content-type'] = 'application/x-www-form-urlencoded';
    if (init.json !== undefined) headers['content-type'] = 'application/json';
    // fetch writes a multipart body's Content-Type itself, with the boundary.
    const body = init.multipart ?? (init.form ? new URLSearchParams(init.form).toString() : init.json !== undefined ? JSON.stringify(init.json) : undefined);
    const response = await fetch(url, {
      method: init.method ?? (body !== undefined ? 'POST' : 'GET'),
      headers,
      body,
      redirect: 'manual',
    });
    if (ownSite) this.keepCookies(response.headers.getSetCookie());
    const bytes = Buffer.from(await response.arrayBuffer());
    // Decoded as response.text() does, which drops a leading byte-order mark.
    return { status: response.status, location: response.headers.get('location'), text: new TextDecoder().decode(bytes), bytes, headers: response.headers };
  }

  /** Asks Spanledger to sign in; returns where it sends the browser and the AuthnRequest it made. */
  async startSignIn(returnTo?: string): Promise<{ idpUrl: string; request: AuthnRequest; samlRequest: string; relayState: string | null }> {
    const response = await this.request(`/auth/saml/login${returnTo === undefined ? '' : `?returnTo=${encodeURIComponent(returnTo)}`}`);
    if (response.status !== 302 || !response.location) throw new Error(`sign-in did not redirect: ${response.status}`);
    const idpUrl = new URL(response.location);
    const samlRequest = idpUrl.searchParams.get('SAMLRequest') ?? '';
    return { idpUrl: response.location, request: decodeRedirectRequest(samlRequest), samlRequest, relayState: idpUrl.searchParams.get('RelayState') };
  }

  /** The whole journey through the local identity provider's page, as the person with `subject`. */
  async signInAs(subject: string, returnTo?: string): Promise<ClientResponse> {
    const { idpUrl, samlRequest, relayState } = await this.startSignIn(returnTo);
    const page = await this.request(idpUrl);
    if (page.status !== 200 || !page.text.includes(`data-subject="${subject}"`)) throw new Error(`the sign-in page does not offer ${subject}`);
    const form: Record<string, string> = { SAMLRequest: samlRequest, subject };
    if (relayState !== null) form['RelayState'] = relayState;
    const answer = await this.request(new URL('sso', idpUrl).toString(), { form });
    return this.postToCallback(formField(answer.text, 'SAMLResponse') ?? '', formField(answer.text, 'RelayState'));
  }

  /** What the identity provider's auto-submitting form does: POST the response to the assertion consumer. */
  postToCallback(samlResponse: string, relayState: string | null = null): Promise<ClientResponse> {
    const form: Record<string, string> = { SAMLResponse: samlResponse };
    if (relayState !== null) form['RelayState'] = relayState;
    return this.request('/auth/saml/callback', { form, xsrf: false });
  }

  private keepCookies(setCookies: string[]): void {
    for (const line of setCookies) {
      const [pair = '', ...attributes] = line.split(';');
      const separator = pair.indexOf('=');
      const name = pair.slice(0, separator).trim();
      const value = pair.slice(separator + 1).trim();
      const expired = attributes.some((attribute) => /^\s*expires=Thu, 01 Jan 1970/i.test(attribute)) || value === '';
      if (expired) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
}
