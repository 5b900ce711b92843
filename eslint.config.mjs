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
)
