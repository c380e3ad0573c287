// Piscina worker entry. Worker threads do not inherit the TypeScript loader of a parent run
// under vitest (and only sometimes under tsx), so this plain-JavaScript entry registers tsx for
// itself, scoped to this import, and loads the TypeScript task module through it.
import { tsImport } from 'tsx/esm/api';

const task = await tsImport('./analysis-task.ts', import.meta.url);

export default task.runAnalysisTask;
