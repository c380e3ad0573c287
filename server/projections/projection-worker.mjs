// Piscina worker entry for long projections. Worker threads do not inherit the TypeScript
// loader of their parent (vitest, tsx), so this plain-JavaScript entry registers tsx for itself.
import { tsImport } from 'tsx/esm/api';

const task = await tsImport('./projection-task.ts', import.meta.url);

export default task.default;
