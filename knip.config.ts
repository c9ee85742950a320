import type { KnipConfig } from 'knip'

// Unused files, exports and dependencies; `npm test` fails on any. The Vite, Vitest, Vue,
// ESLint and unplugin-vue-components plugins find their own entries (index.html → src/main.ts,
// the test projects in vite.config.ts); the entries below are what no plugin can see.
const config: KnipConfig = {
  entry: [
    'server/index.ts',
    // piscina and the Worker preload load these by path (server/workers/engine-pool.ts)
    'server/workers/engine-task.ts',
    'server/workers/register-tsx.mjs',
    'scripts/*.ts',
    // the test-recording generator's command line (npx tsx scripts/test-recordings/make.ts)
    'scripts/test-recordings/make.ts',
    // knex reads these folders by path; knexfile.ts exports a function, so knip's knex plugin can't
    'migrations/*.ts',
    'seeds/*.ts',
  ],
  project: ['**/*.{ts,vue,js,mjs}'],
  // knex loads the driver named by `client: 'pg'` in knexfile.ts with a require of its own
  // and PrimeVue's Chart component imports chart.js itself, at run time
  ignoreDependencies: ['pg', 'chart.js'],
  // Debian's media and speech tools, installed by scripts/lib/setup.sh (ensure_media_tools), not by npm
  ignoreBinaries: ['ffmpeg', 'espeak-ng', 'sox'],
  // knip's default issue types plus import cycles, which it leaves out by default: a cycle is a
  // layering mistake here (shared/engine ↔ shared/schemas in particular)
  include: ['files', 'dependencies', 'unlisted', 'binaries', 'unresolved', 'exports', 'types', 'enumMembers', 'namespaceMembers', 'duplicates', 'cycles'],
}

export default config
