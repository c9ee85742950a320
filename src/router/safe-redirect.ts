/** Only same-app paths: an absolute or protocol-relative URL in `redirect` would be an open redirect. */
export function safeRedirect(raw: unknown): string {
  if (typeof raw !== 'string' || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return '/'
  if (raw === '/sign-in' || raw.startsWith('/sign-in?')) return '/'
  return raw
}

/** Pages the server serves outside this app (the public episode page): reached by a full page load, not the router. */
export function isOutsideApp(path: string): boolean {
  return path.startsWith('/episodes/')
}
