import { config } from 'zod';

// Imported first by main.ts, before any schema of @tropline/core/contract parses: zod otherwise
// probes for `new Function` support, which a page whose policy forbids eval reports as a
// violation. The interpreted parsers give the same answers.
config({ jitless: true });
