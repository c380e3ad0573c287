import { Router } from 'express';
import { acceptBody, inviteBody, lookupBody, roleBody } from './account-schemas';
import { requireTenantAction } from './access-guard';
import type { InvitationsService } from './invitations-service';
import type { MembersService } from './members-service';
import { parseBody } from './parse-body';
import { accessOf, clientAddress, userOf } from './signed-in-user';

/** `/members`: who is in the tenant, their roles, and removal. */
export function membersRoutes(members: MembersService): Router {
  const router = Router();

  router.get('/members', requireTenantAction('members:read'), async (req, res) => {
    res.json({ members: await members.list(accessOf(req).tenantId) });
  });

  router.patch('/members/:userId', requireTenantAction('members:manage'), async (req, res) => {
    const body = parseBody(roleBody, req.body);
    const member = await members.changeRole(
      accessOf(req),
      userOf(req),
      String(req.params.userId),
      body.role,
      clientAddress(req),
    );
    res.json(member);
  });

  router.delete('/members/:userId', requireTenantAction('members:manage'), async (req, res) => {
    await members.remove(accessOf(req), userOf(req), String(req.params.userId), clientAddress(req));
    res.status(204).end();
  });
  return router;
}

/**
 * `/invitations`: admins invite, list and withdraw; the link's holder looks the invitation up
 * and accepts it (no session needed: the token is the credential).
 */
export function invitationsRoutes(invitations: InvitationsService): Router {
  const router = Router();
  const manage = requireTenantAction('members:manage');

  router.get('/invitations', manage, async (req, res) => {
    res.json({ invitations: await invitations.pending(accessOf(req).tenantId) });
  });

  router.post('/invitations', manage, async (req, res) => {
    const body = parseBody(inviteBody, req.body);
    const created = await invitations.invite(accessOf(req), userOf(req), body, clientAddress(req));
    res.status(201).location(`/api/v1/invitations/${created.id}`).json(created);
  });

  router.delete('/invitations/:id', manage, async (req, res) => {
    await invitations.revoke(accessOf(req), userOf(req), String(req.params.id), clientAddress(req));
    res.status(204).end();
  });

  router.post('/invitations/lookup', async (req, res) => {
    const body = parseBody(lookupBody, req.body);
    res.set('Cache-Control', 'no-store').json(await invitations.lookup(body.token));
  });

  router.post('/invitations/accept', async (req, res) => {
    const body = parseBody(acceptBody, req.body);
    res.json(await invitations.accept(body.token, body, clientAddress(req)));
  });
  return router;
}
