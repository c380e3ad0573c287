// odex ships its TypeScript source beside the JavaScript and no declarations; TypeScript would
// type-check that source under our strict settings. This re-export plus the hand-written
// declarations beside it are what `odex` resolves to (see the `paths` entry in tsconfig.json).
export * from 'odex/src/odex.js';
