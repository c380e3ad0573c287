import { KeysService } from '../keys/keys-service';
import { TenantsService } from '../tenants/tenants-service';
import { integerOption, stringOption, UsageError, type CliCommand } from './cli-command';

/** `issue-key --tenant S --kind server|browser [--origin URL]… [--scopes a,b]`: the full key. */
export const issueKeyCommand: CliCommand = {
  name: 'issue-key',
  usage:
    'issue-key --tenant S --kind server|browser [--origin URL]... [--scopes a,b] [--name N] ' +
    '[--expires-in-days D] [--per-minute M]',
  options: {
    tenant: { type: 'string' },
    kind: { type: 'string' },
    origin: { type: 'string', multiple: true },
    scopes: { type: 'string' },
    name: { type: 'string' },
    'expires-in-days': { type: 'string' },
    'per-minute': { type: 'string' },
  },
  required: ['tenant', 'kind'],
  async run(ctx) {
    const kind = stringOption(ctx, 'kind');
    if (kind !== 'server' && kind !== 'browser') {
      throw new UsageError(`--kind must be server or browser, got "${kind}"`);
    }
    const tenant = await new TenantsService(ctx.db).require(stringOption(ctx, 'tenant'));
    const days = integerOption(ctx, 'expires-in-days');
    const scopes = ctx.options.scopes;
    const issued = await new KeysService(ctx.db).issue(
      {
        tenantId: tenant.id,
        kind,
        name: typeof ctx.options.name === 'string' ? ctx.options.name : undefined,
        origins: (ctx.options.origin as string[] | undefined) ?? [],
        scopes: typeof scopes === 'string' ? scopes.split(',').map((s) => s.trim()) : undefined,
        expiresAt: days ? new Date(Date.now() + days * 86_400_000).toISOString() : undefined,
        perMinute: integerOption(ctx, 'per-minute'),
      },
      'cli',
    );
    process.stderr.write(
      `issued ${issued.key.label} (${issued.key.scopes.join(', ')}); it is shown only now.\n`,
    );
    return issued.token;
  },
};

/** `revoke-key --key K`: K is a key id or a full key. */
export const revokeKeyCommand: CliCommand = {
  name: 'revoke-key',
  usage: 'revoke-key --key K   (a key id, its label, or the full key)',
  options: { key: { type: 'string' } },
  required: ['key'],
  async run(ctx) {
    const keys = new KeysService(ctx.db);
    const key = await keys.resolve(stringOption(ctx, 'key'));
    if (!key) throw new UsageError('no such key');
    await keys.revoke(key, 'cli');
    return key.id;
  },
};

/** `rotate-key --key K [--overlap-seconds S]`: prints the successor's full key. */
export const rotateKeyCommand: CliCommand = {
  name: 'rotate-key',
  usage: 'rotate-key --key K [--overlap-seconds S]   (default overlap: 86400)',
  options: { key: { type: 'string' }, 'overlap-seconds': { type: 'string' } },
  required: ['key'],
  async run(ctx) {
    const keys = new KeysService(ctx.db);
    const key = await keys.resolve(stringOption(ctx, 'key'));
    if (!key) throw new UsageError('no such key');
    const rotated = await keys.rotate(key, integerOption(ctx, 'overlap-seconds') ?? 86_400, 'cli');
    process.stderr.write(`${key.id} stays valid until ${rotated.previous.expiresAt}\n`);
    return rotated.token;
  },
};

/** `list-keys --tenant S`: one line per key, no secrets. */
export const listKeysCommand: CliCommand = {
  name: 'list-keys',
  usage: 'list-keys --tenant S',
  options: { tenant: { type: 'string' } },
  required: ['tenant'],
  async run(ctx) {
    const tenant = await new TenantsService(ctx.db).require(stringOption(ctx, 'tenant'));
    const keys = await new KeysService(ctx.db).list(tenant.id);
    return JSON.stringify(keys);
  },
};
