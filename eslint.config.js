import { builtinModules } from 'node:module'
import { defineConfig, globalIgnores } from 'eslint/config'
import js from '@eslint/js'
import tseslint from 'typescript-eslint'
import vue from 'eslint-plugin-vue'

const SHARED_IS_ISOMORPHIC = 'shared/ runs in the browser and in Node alike: no Vue, Express, knex, Node or DOM here'

export default defineConfig(
  globalIgnores(['dist/', 'coverage/', '.data/', 'test-results/', 'src/components.d.ts']),

  js.configs.recommended,
  tseslint.configs.recommended,
  vue.configs['flat/recommended'],
  // this project has no formatter and doesn't reformat code through the linter
  vue.configs['no-layout-rules'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'] } },
    // TypeScript already reports undefined names, and knows the DOM globals ESLint would need listed
    rules: { 'no-undef': 'off' },
  },

  {
    rules: {
      // `_` marks a parameter a signature needs but the body doesn't (tsconfig's noUnusedParameters agrees)
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-restricted-syntax': [
        'error',
        { selector: "MemberExpression[object.type='MetaProperty'][property.name='env']", message: 'Read import.meta.env in src/config.ts only.' },
      ],
    },
  },
  { files: ['src/config.ts'], rules: { 'no-restricted-syntax': 'off' } },
  // tests declare small stand-in components beside the test that mounts them
  { files: ['tests/**'], rules: { 'vue/one-component-per-file': 'off' } },

  // A forgotten await loses an error in a route or a worker call, and makes a test that cannot fail
  // (an unawaited `expect(…).rejects` or user-event call). These rules need type information, which
  // triples the lint's CPU time (10 s → 28 s); shared/ has no promises, so it is left out of them.
  // The rest of recommendedTypeChecked, with .vue files, took 55 s and mostly reported .vue imports
  // (this parser sees them as `any`), so those stay off.
  {
    files: ['**/*.ts'],
    ignores: ['**/*.d.ts', 'shared/**'],
    languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname } },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': 'error',
      '@typescript-eslint/await-thenable': 'error',
    },
  },

  {
    files: ['src/**', 'server/**', 'shared/**', 'migrations/**', 'seeds/**'],
    ignores: ['server/config.ts'],
    rules: {
      'no-restricted-properties': ['error', { object: 'process', property: 'env', message: 'Read the environment in server/config.ts only.' }],
    },
  },
  {
    files: ['src/**', 'server/**'],
    rules: { 'no-console': 'error' },
  },

  {
    files: ['shared/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['vue', 'vue-router', 'pinia', 'primevue', 'primevue/*', '@vueuse/*'], message: SHARED_IS_ISOMORPHIC },
            { group: ['express', 'knex', 'pg', 'pino', 'piscina'], message: SHARED_IS_ISOMORPHIC },
            { group: ['node:*', ...builtinModules], message: SHARED_IS_ISOMORPHIC },
          ],
        },
      ],
      'no-restricted-globals': [
        'error',
        ...['window', 'document', 'navigator', 'localStorage', 'process', 'Buffer'].map((name) => ({ name, message: SHARED_IS_ISOMORPHIC })),
      ],
    },
  },
)
