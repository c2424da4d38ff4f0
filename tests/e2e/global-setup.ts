/**
 * One app server (tests/e2e/app-server.ts) for all the browser tests; they read its address with
 * inject('baseUrl').
 */
import type { TestProject } from 'vitest/node';
import { startAppServer } from './app-server';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const server = await startAppServer();
  project.provide('baseUrl', server.baseUrl);
  return () => server.stop();
}
