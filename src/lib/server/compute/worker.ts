/**
 * The worker thread's module (piscina calls its default export once per task). The build bundles this
 * file into dist/server/compute-worker.mjs (see ./build.mjs); it must import nothing that touches the
 * database, the request or Astro.
 */
import { runJob, type ComputeKind } from './jobs';

export interface ComputeTask {
  kind: ComputeKind;
  input: unknown;
}

export default function run(task: ComputeTask): unknown {
  return runJob(task.kind, task.input as never);
}
