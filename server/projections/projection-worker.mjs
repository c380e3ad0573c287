// Piscina worker entry for long projections. Worker threads do not inherit the TypeScript
// loader of their parent (vitest, tsx), so this plain-JavaScript entry registers tsx for itself.
// It first lowers this thread's priority (the pool's `niceness`): the request thread, which
// answers every tenant's short projections, keeps its core while long ones run here.
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const { lowerThreadPriority } = await tsImport('@tropline/core/node', import.meta.url);
lowerThreadPriority(workerData?.niceness ?? 0);

const task = await tsImport('./projection-task.ts', import.meta.url);

export default task.default;
