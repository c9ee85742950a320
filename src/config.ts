/** The only module that reads import.meta.env on the client. */
export const config = Object.freeze({
  apiBase: import.meta.env.VITE_API_BASE ?? '/api',
  isDev: import.meta.env.DEV,
})
