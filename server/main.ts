import type { AddressInfo } from 'node:net';
import { ConfigError, loadConfig } from './config';
import { createApp } from './create-app';

/**
 * Starts the API (and, unless TROPLINE_SERVE_APPS=0, the built front ends) on $PORT.
 * Configuration problems end the process with one clear line naming the variable.
 */
async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig(process.env);
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(`tropline: configuration error: ${err.message}`);
      process.exit(2);
    }
    throw err;
  }
  const app = createApp(config);
  const context = app.locals.tropline;
  try {
    const outcome = await context.ready;
    if (outcome.migrated.length) console.log(`migrated: ${outcome.migrated.join(', ')}`);
    if (outcome.seeded) console.log('seeded the demo tenant');
  } catch (err) {
    console.error(`tropline: cannot prepare the database ${config.sqliteFile}: ${String(err)}`);
    process.exit(1);
  }
  const server = app.listen(config.port);
  server.on('error', (err: NodeJS.ErrnoException) => {
    const why = err.code === 'EADDRINUSE' ? 'the port is already in use' : err.message;
    console.error(`tropline: PORT: cannot listen on ${config.port}: ${why}`);
    process.exit(2);
  });
  server.on('listening', () => {
    const { port } = server.address() as AddressInfo;
    console.log(`listening on ${port}`);
    process.send?.({ listening: port });
  });
  // Requests that compute are bounded server-side; these stop slow clients holding sockets.
  server.requestTimeout = 60_000;
  server.headersTimeout = 15_000;
  const stop = () => {
    server.close(() => void context.close().then(() => process.exit(0)));
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

void main();
