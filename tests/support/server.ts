import { fileURLToPath } from 'node:url'
import { setup } from '@nuxt/test-utils/e2e'

export const rootDir = fileURLToPath(new URL('../..', import.meta.url))

/**
 * Starts the server built once by `npm test` (no build per file), against the test database that
 * scripts/test.sh recreated and seeded. Extra environment (e.g. a test's own mail catcher) goes in `env`.
 */
export async function useBuiltServer(env: Record<string, string> = {}) {
  await setup({
    rootDir,
    build: false,
    server: true,
    browser: false,
    env,
    nuxtConfig: { nitro: { output: { dir: `${rootDir}.output` } } },
  })
}
