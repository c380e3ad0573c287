import { buildAll } from './build-steps';

// `npm run build [-- --force] [-- core widgets …]`: builds what changed, in dependency order.
const args = process.argv.slice(2);
const only = args.filter((a) => !a.startsWith('--'));
buildAll({ force: args.includes('--force'), only: only.length ? only : undefined });
