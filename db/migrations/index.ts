// Migrations are imported statically: a bundled Nitro server cannot read a
// migrations folder at run time (stack.md, gotcha 2). Add each new file here,
// in order; names must sort in the order they run.
import type { Migration, MigrationProvider } from 'kysely'
import * as m0001 from './0001_init'

export const migrations: Record<string, Migration> = {
  '0001_init': m0001,
}

export const staticMigrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
}
