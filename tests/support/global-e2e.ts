// Global set-up of the `e2e` project: the built app with the demo scenario on stormledger_e2e.
import type { TestProject } from 'vitest/node'
import { startApp, testPortBase } from './app-process'

export default async function setup(project: TestProject) {
  const port = testPortBase() + 2
  const mailPort = testPortBase() - 498
  const stop = await startApp({ dbName: 'stormledger_e2e', port, mailPort, seedDemo: true })
  project.provide('baseUrl', `http://localhost:${port}`)
  project.provide('dbName', 'stormledger_e2e')
  project.provide('appPort', port)
  project.provide('mailPort', mailPort)
  return stop
}
