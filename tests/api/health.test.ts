import { readFileSync } from 'node:fs'
import { $fetch } from '@nuxt/test-utils/e2e'
import { describe, expect, it } from 'vitest'
import { rootDir, useBuiltServer } from '../support/server'

const pkg = JSON.parse(readFileSync(`${rootDir}package.json`, 'utf8')) as { version: string }

describe('GET /api/health', async () => {
  await useBuiltServer()

  it('reports the app version, a reachable database and a current schema', async () => {
    const health = await $fetch<{ status: string, version: string, database: { reachable: boolean, migrationsCurrent: boolean, pendingMigrations: string[] } }>('/api/health')
    expect(health.status).toBe('ok')
    expect(health.version).toBe(pkg.version)
    expect(health.database).toEqual({ reachable: true, migrationsCurrent: true, pendingMigrations: [] })
  })
})
