/// <reference types="vite/client" />

interface ImportMetaEnv {
  /** Base URL of the HTTP API; defaults to '/api' (same origin, proxied by vite in development). */
  readonly VITE_API_BASE?: string
}

interface ImportMeta {
  readonly env: ImportMetaEnv
}
