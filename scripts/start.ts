import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { ConfigError, loadConfig } from '../server/config';
import { serve, StartupError } from '../server/serve';
import { buildAll, ROOT } from './build-steps';

// `npm start`: build what changed, migrate and seed on first start, serve everything on $PORT.
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
buildAll();
try {
  const running = await serve(config);
  const base = `http://localhost:${running.port}`;
  const keys = (running.app.locals.tropline as { demoKeys?: Record<string, string> }).demoKeys;
  const signIns = running.app.locals.tropline.demoSignIns;
  const mailbox = running.app.locals.tropline.accounts.mailer.catcher;
  const storybook = existsSync(resolve(ROOT, config.distDir, 'storybook'))
    ? `${base}/storybook/`
    : '(not built: npm run storybook:build)';
  console.log(
    [
      '',
      'Tropline is running:',
      `  console      ${base}/console/`,
      `  demo portal  ${base}/demo/`,
      `  API          ${base}/api/v1   (health: ${base}/api/v1/health)`,
      `  API docs     ${base}/api/docs/`,
      `  Storybook    ${storybook}`,
      ...(keys
        ? [
            '',
            'Demo keys (development only; also in demo-keys.json beside the database):',
            ...Object.entries(keys).map(([name, key]) => `  ${name.padEnd(12)} ${key}`),
          ]
        : []),
      ...(signIns
        ? [
            '',
            'Demo sign-ins (development only):',
            ...signIns.map((u) => `  ${u.role.padEnd(9)} ${u.email.padEnd(36)} ${u.password}`),
          ]
        : []),
      ...(mailbox
        ? [
            '',
            `Mail goes to the local catcher (SMTP 127.0.0.1:${mailbox.port}); read it at ` +
              `${base}/console/mailbox`,
          ]
        : []),
      '',
      `listening on ${running.port}`,
    ].join('\n'),
  );
  const stop = () => void running.stop().then(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
} catch (err) {
  if (err instanceof StartupError) {
    console.error(`tropline: ${err.message}`);
    process.exit(2);
  }
  throw err;
}
