// Piscina worker entry. A worker given a .ts file loads it when the parent runs under tsx (the
// loader comes through execArgv) but not under vitest ("Unknown file extension"), so this
// plain-JavaScript entry registers tsx for itself, scoped to this import, and loads the
// TypeScript task module through it. First it lowers this thread's priority (the pool's
// `niceness`), so the request thread keeps its core while analyses run.
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const priority = await tsImport('./thread-priority.ts', import.meta.url);
priority.lowerThreadPriority(workerData?.niceness ?? 0);

const task = await tsImport('./analysis-task.ts', import.meta.url);

export default task.runAnalysisTask;
