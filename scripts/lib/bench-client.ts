/** The JSON calls the benchmark scripts make to set up what they measure (not what they measure). */

/** A JSON request; anything but a 2xx ends the benchmark with the server's answer. */
export async function api(base: string, method: string, path: string, token: string | null, body?: unknown): Promise<unknown> {
  const response = await fetch(base + path, {
    method,
    headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
  const text = await response.text()
  if (!response.ok) throw new Error(`${method} ${path} answered ${response.status}: ${text.slice(0, 300)}`)
  return text ? JSON.parse(text) : undefined
}

export async function signIn(base: string, email: string, password: string): Promise<string> {
  const body = (await api(base, 'POST', '/api/auth/sign-in', null, { email, password })) as { token: string }
  return body.token
}
