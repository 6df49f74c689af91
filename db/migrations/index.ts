// Migrations are imported statically: a bundled Nitro server cannot read a
// migrations folder at run time (stack.md, gotcha 2). Add each new file here,
// in order; names sort in the order they run, and the migrator refuses any other
// order (db/open.ts).
import type { Migration, MigrationProvider } from 'kysely'
import * as m0001 from './0001_init'
import * as m0002 from './0002_practice'
import * as m0003 from './0003_quizzes'
import * as m0004 from './0004_review'
import * as m0005 from './0005_fundus'
import * as m0006 from './0006_practice_extra'
import * as m0007 from './0007_review_learners'
import * as m0008 from './0008_invitation_name'
import * as m0009 from './0009_quiz_fundus'
import * as m0010 from './0010_sessions'
import * as m0012 from './0012_rule_swap_evidence'
import * as m0013 from './0013_lti'
import * as m0015 from './0015_shared_state'
import * as m0016 from './0016_pg_review_filters'

export const migrations: Record<string, Migration> = {
  '0001_init': m0001,
  '0002_practice': m0002,
  '0003_quizzes': m0003,
  '0004_review': m0004,
  '0005_fundus': m0005,
  '0006_practice_extra': m0006,
  '0007_review_learners': m0007,
  '0008_invitation_name': m0008,
  '0009_quiz_fundus': m0009,
  '0010_sessions': m0010,
  '0012_rule_swap_evidence': m0012,
  '0013_lti': m0013,
  '0015_shared_state': m0015,
  '0016_pg_review_filters': m0016,
}

export const staticMigrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
}
