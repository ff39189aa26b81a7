// Global set-up of the `server` project: the built app on the stormledger_test database.
import type { TestProject } from 'vitest/node'
import { startApp, testPortBase } from './app-process'

export const SERVER_TEST = { dbName: 'stormledger_test', port: testPortBase() + 1, mailPort: testPortBase() - 499, s3Port: testPortBase() - 497 }

export default async function setup(project: TestProject) {
  const { stop, s3FakePid } = await startApp({ ...SERVER_TEST, seedDemo: false })
  project.provide('baseUrl', `http://localhost:${SERVER_TEST.port}`)
  project.provide('dbName', SERVER_TEST.dbName)
  project.provide('appPort', SERVER_TEST.port)
  project.provide('mailPort', SERVER_TEST.mailPort)
  project.provide('s3Port', SERVER_TEST.s3Port)
  project.provide('s3FakePid', s3FakePid)
  return stop
}

declare module 'vitest' {
  export interface ProvidedContext { baseUrl: string, dbName: string, appPort: number, mailPort: number, s3Port: number, s3FakePid: number }
}
