import { ConfigError, loadConfig } from './config';
import { serve, StartupError } from './serve';

/**
 * `npm run api`: the API (and, unless TROPLINE_SERVE_APPS=0, the built front ends) on $PORT.
 * Configuration problems end the process with one clear line naming the variable.
 */
export async function main(): Promise<void> {
  try {
    const running = await serve(loadConfig(process.env));
    console.log(`listening on ${running.port}`);
    const stop = () => {
      void running.stop().then(() => process.exit(0));
      setTimeout(() => process.exit(0), 5000).unref();
    };
    process.on('SIGTERM', stop);
    process.on('SIGINT', stop);
  } catch (err) {
    if (err instanceof ConfigError || err instanceof StartupError) {
      console.error(
        `tropline: ${err instanceof ConfigError ? 'configuration error: ' : ''}${err.message}`,
      );
      process.exit(2);
    }
    throw err;
  }
}

if (import.meta.url === `file://${process.argv[1]}`) void main();
