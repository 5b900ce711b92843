// Three projects, named as the code is: unit (pure modules, and the components under
// tests/unit/components, which ask for a Nuxt environment file by file), server (the built app on
// the real PostgreSQL) and e2e (browser journeys that drive the same app in Chromium). server and
// e2e share one global setup: one app, one database, one mail catcher for the run. `npm test`
// builds the app before this runs.
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'
import { fileURLToPath } from 'node:url'

const appProject = {
  environment: 'node' as const,
  globalSetup: ['tests/support/global-setup.ts'],
  testTimeout: 30_000,
  hookTimeout: 60_000,
}

export default defineConfig({
  resolve: { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
  test: {
    reporters: ['default', './tests/support/closing-line.ts'],
    projects: [
      await defineVitestProject({
        // Starting Nuxt for a component file takes seconds on a busy machine.
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', hookTimeout: 60_000 },
      }),
      { extends: true, test: { name: 'server', include: ['tests/server/**/*.test.ts'], ...appProject } },
      { extends: true, test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], ...appProject } },
    ],
  },
})
