// Worker entry of the quota ledger's thread. Worker threads do not inherit the TypeScript
// loader of their parent (vitest, tsx), so this plain-JavaScript entry registers tsx for itself.
import { tsImport } from 'tsx/esm/api';

await tsImport('./ledger-thread.ts', import.meta.url);
