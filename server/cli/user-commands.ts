import { isTenantRole } from '@tropline/core';
import { AuditRepository } from '../audit/audit-repository';
import { normaliseEmail } from '../accounts/email-address';
import { hashCostFor, PasswordHasher } from '../accounts/password-hasher';
import { UsersService } from '../accounts/users-service';
import { TenantsService } from '../tenants/tenants-service';
import { stringOption, UsageError, type CliCommand } from './cli-command';

/**
 * `create-user --tenant S --email E --role owner|admin|analyst|viewer [--name N]` (or
 * `--operator` instead of tenant and role): prints the user id. The password comes from
 * TROPLINE_PASSWORD, never from the command line, where it would land in shell history and in
 * the process list. For an existing account it adds (or changes) the membership only.
 */
export const createUserCommand: CliCommand = {
  name: 'create-user',
  usage:
    'create-user --tenant S --email E --role owner|admin|analyst|viewer [--name N]  ' +
    '(or --operator instead of --tenant/--role; password from TROPLINE_PASSWORD)',
  options: {
    tenant: { type: 'string' },
    email: { type: 'string' },
    role: { type: 'string' },
    name: { type: 'string' },
    operator: { type: 'boolean' },
  },
  required: ['email'],
  async run(ctx) {
    const operator = ctx.options.operator === true;
    const email = normaliseEmail(stringOption(ctx, 'email'));
    const role = operator ? undefined : stringOption(ctx, 'role');
    if (role !== undefined && !isTenantRole(role)) {
      throw new UsageError(`--role must be owner, admin, analyst or viewer, got "${role}"`);
    }
    if (operator && ctx.options.tenant !== undefined) {
      throw new UsageError('--operator is a platform account; leave out --tenant and --role');
    }
    const tenant = operator
      ? undefined
      : await new TenantsService(ctx.db).require(stringOption(ctx, 'tenant'));
    const users = new UsersService(ctx.db, new PasswordHasher(hashCostFor(ctx.env.NODE_ENV)));
    const existing = await users.repository.findByEmail(email);
    if (existing && tenant && role) {
      const at = new Date().toISOString();
      await ctx.db.transaction(async (trx) => {
        await users.repository.with(trx).putMembership(existing.id, tenant.id, role, at);
        await new AuditRepository(trx).record({
          tenantId: tenant.id,
          actor: 'cli',
          action: 'member.add',
          target: `user:${existing.id}`,
          detail: { role },
          at,
        });
      });
      process.stderr.write(`${email} already had an account; now ${role} of ${tenant.slug}.\n`);
      return existing.id;
    }
    const password = ctx.env.TROPLINE_PASSWORD;
    if (!password) {
      throw new UsageError('set the password in the TROPLINE_PASSWORD environment variable');
    }
    const name = typeof ctx.options.name === 'string' ? ctx.options.name : email.split('@')[0]!;
    const user = await users.create(
      { email, name, password, operator, tenantId: tenant?.id, role },
      'cli',
    );
    process.stderr.write(
      `created ${email}${tenant ? ` as ${role} of ${tenant.slug}` : ' (platform operator)'}.\n`,
    );
    return user.id;
  },
};
