// Global set-up of the `e2e` project: the built app with the demo scenario on stormledger_e2e.
import type { TestProject } from 'vitest/node'
import { startApp, testPortBase } from './app-process'

export default async function setup(project: TestProject) {
  const port = testPortBase() + 2
  const mailPort = testPortBase() - 498
  const s3Port = testPortBase() - 496
  const { stop, s3FakePid } = await startApp({ dbName: 'stormledger_e2e', port, mailPort, s3Port, seedDemo: true })
  project.provide('baseUrl', `http://localhost:${port}`)
  project.provide('dbName', 'stormledger_e2e')
  project.provide('appPort', port)
  project.provide('mailPort', mailPort)
  project.provide('s3Port', s3Port)
  project.provide('s3FakePid', s3FakePid)
  return stop
}
