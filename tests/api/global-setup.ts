import type { TestProject } from 'vitest/node'
import { startServer } from '../support/server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
    dbPath: string
    /** The global server's PostgreSQL database (PostgreSQL tier), else ''. */
    databaseUrl: string
  }
}

export default async function setup(project: TestProject) {
  const server = await startServer()
  project.provide('baseURL', server.baseURL)
  project.provide('dbPath', server.dbPath)
  project.provide('databaseUrl', server.databaseUrl ?? '')
  return async () => {
    await server.stop()
  }
}
