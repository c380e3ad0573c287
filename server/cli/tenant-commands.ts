import { QuotasService } from '../quotas/quotas-service';
import { TenantsService } from '../tenants/tenants-service';
import { integerOption, stringOption, UsageError, type CliCommand } from './cli-command';

/** `create-tenant --slug S --name N`: prints the tenant id. */
export const createTenantCommand: CliCommand = {
  name: 'create-tenant',
  usage: 'create-tenant --slug S --name N',
  options: { slug: { type: 'string' }, name: { type: 'string' } },
  required: ['slug', 'name'],
  async run(ctx) {
    const tenant = await new TenantsService(ctx.db).create(
      stringOption(ctx, 'slug'),
      stringOption(ctx, 'name'),
    );
    return tenant.id;
  },
};

/** `set-quota --tenant S --monthly-units N [--per-minute M] [--browser-per-minute B]`. */
export const setQuotaCommand: CliCommand = {
  name: 'set-quota',
  usage: 'set-quota --tenant S --monthly-units N [--per-minute M] [--browser-per-minute B]',
  options: {
    tenant: { type: 'string' },
    'monthly-units': { type: 'string' },
    'per-minute': { type: 'string' },
    'browser-per-minute': { type: 'string' },
  },
  required: ['tenant', 'monthly-units'],
  async run(ctx) {
    const tenant = await new TenantsService(ctx.db).require(stringOption(ctx, 'tenant'));
    const monthlyUnits = integerOption(ctx, 'monthly-units');
    if (monthlyUnits === undefined) throw new UsageError('--monthly-units is required');
    const plan = await new QuotasService(ctx.db).setPlan(
      tenant.id,
      {
        monthlyUnits,
        perMinute: integerOption(ctx, 'per-minute'),
        browserPerMinute: integerOption(ctx, 'browser-per-minute'),
      },
      'cli',
    );
    return JSON.stringify(plan);
  },
};
