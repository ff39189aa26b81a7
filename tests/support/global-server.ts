// Global set-up of the `server` project: the built app on the stormledger_test database.
import type { TestProject } from 'vitest/node'
import { startApp, testPortBase } from './app-process'

export const SERVER_TEST = { dbName: 'stormledger_test', port: testPortBase() + 1, mailPort: testPortBase() - 499 }

export default async function setup(project: TestProject) {
  const stop = await startApp({ ...SERVER_TEST, seedDemo: false })
  project.provide('baseUrl', `http://localhost:${SERVER_TEST.port}`)
  project.provide('dbName', SERVER_TEST.dbName)
  project.provide('appPort', SERVER_TEST.port)
  project.provide('mailPort', SERVER_TEST.mailPort)
  return stop
}

declare module 'vitest' {
  export interface ProvidedContext { baseUrl: string, dbName: string, appPort: number, mailPort: number }
}
