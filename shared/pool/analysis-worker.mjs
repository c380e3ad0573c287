// Piscina worker entry. A worker given a .ts file loads it when the parent runs under tsx (the
// loader comes through execArgv) but not under vitest ("Unknown file extension"), so this
// plain-JavaScript entry registers tsx for itself, scoped to this import, and loads the
// TypeScript task module through it.
import { tsImport } from 'tsx/esm/api';

const task = await tsImport('./analysis-task.ts', import.meta.url);

export default task.runAnalysisTask;
