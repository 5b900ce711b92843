// Three projects: unit (pure modules), server (the built app on the real PostgreSQL, including
// the browser journeys in tests/server/journeys, which drive the same app in Chromium), and nuxt
// (components in a Nuxt environment). `npm test` builds the app before this runs.
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'
import { fileURLToPath } from 'node:url'

const alias = { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) }

export default defineConfig({
  test: {
    reporters: ['default', './tests/support/closing-line.ts'],
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      await defineVitestProject({
        // Setting Nuxt up for a file that imports a whole page takes over ten seconds on a busy machine.
        test: { name: 'nuxt', include: ['tests/nuxt/**/*.test.ts'], environment: 'nuxt', hookTimeout: 60_000 },
      }),
    ],
  },
})
