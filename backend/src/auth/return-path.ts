const PLACEHOLDER_ORIGIN = 'http://return-path.invalid';

/**
 * Where to send the browser after sign-in: a path on this site only. Anything that could leave it
 * (`https://evil.example`, `//evil.example`, `/\evil.example`, odd characters) becomes `/`.
 */
export function safeReturnPath(candidate: unknown): string {
  if (typeof candidate !== 'string' || !candidate.startsWith('/') || candidate.startsWith('//') || /[\\\u0000-\u001f\u007f]/.test(candidate)) return '/';
  const url = new URL(candidate, PLACEHOLDER_ORIGIN);
  if (url.origin !== PLACEHOLDER_ORIGIN) return '/';
  return `${url.pathname}${url.search}${url.hash}`;
}
