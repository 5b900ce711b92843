// ESLint through @nuxt/eslint (flat config), with the project's few additions.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['.output/**', '.nuxt/**', '.data/**', 'node_modules/**'],
  },
  {
    rules: {
      // Tests and the HTTP helper read loosely typed JSON on purpose.
      '@typescript-eslint/no-explicit-any': 'off',
      'vue/multi-word-component-names': 'off',
    },
  },
  // The layers stay apart. shared/ is pure: both sides, the scripts and the migrations' tests use
  // it, so nothing of the browser's framework, the server's or the database's comes in.
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{
          group: ['vue', 'vue/*', '@vue/*', 'h3', 'nitropack', 'nitropack/*', 'kysely', 'nuxt', 'nuxt/*', '#imports', '#app'],
          message: 'shared/ holds pure code for both sides: no Vue, h3, Nitro or Kysely here.',
        }],
      }],
    },
  },
  // The client never reaches into server/: its types come from InternalApi (through Serialize,
  // as JSON arrives) or from shared/.
  {
    files: ['app.vue', 'error.vue', '{pages,components,composables,stores,layouts,middleware,plugins,utils}/**/*.{ts,vue}'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{
          group: ['~~/server', '~~/server/*', '~/server/*', '**/server/*', '../server/*'],
          message: 'The client does not import from server/: take the type from InternalApi (Serialize<...>) or from shared/.',
        }],
      }],
    },
  },
)
