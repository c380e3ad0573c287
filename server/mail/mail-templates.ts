import type { MailMessage } from './mail-message';

/** Escapes text for HTML element content and attribute values. */
function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** A readable UTC time for mail bodies: `2026-12-03 14:05 UTC`. */
function when(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

interface Block {
  /** Paragraphs of plain text (escaped for the HTML part). */
  readonly paragraphs: readonly string[];
  /** An optional call to action. */
  readonly action?: { readonly label: string; readonly url: string };
  /** Small print under the action. */
  readonly footnote?: string;
}

/** Lays one message out twice: a plain-text part and a simple, inline-styled HTML part. */
function compose(template: string, to: string, subject: string, block: Block): MailMessage {
  const text = [
    ...block.paragraphs,
    ...(block.action ? [`${block.action.label}:\n${block.action.url}`] : []),
    ...(block.footnote ? [block.footnote] : []),
    '— Tropline, food-chain scenarios for resource agencies',
  ].join('\n\n');
  const paragraphs = block.paragraphs
    .map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`)
    .join('\n');
  const action = block.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(block.action.url)}" ` +
      `style="background:#2f5d50;color:#fff;padding:10px 18px;border-radius:4px;` +
      `text-decoration:none">${escapeHtml(block.action.label)}</a></p>\n` +
      `<p style="margin:0 0 14px;font-size:13px;color:#555">If the button does not work, ` +
      `paste this address into your browser:<br>${escapeHtml(block.action.url)}</p>`
    : '';
  const footnote = block.footnote
    ? `<p style="margin:0 0 14px;font-size:13px;color:#555">${escapeHtml(block.footnote)}</p>`
    : '';
  const html =
    `<!doctype html>\n<html><body style="font-family:Roboto,Arial,sans-serif;color:#1d2b27;` +
    `max-width:560px;margin:0 auto;padding:24px">\n` +
    `<h1 style="font-size:18px;color:#2f5d50;margin:0 0 18px">${escapeHtml(subject)}</h1>\n` +
    `${paragraphs}\n${action}\n${footnote}\n` +
    `<p style="margin:24px 0 0;font-size:12px;color:#777">Tropline — food-chain scenarios ` +
    `for resource agencies</p>\n</body></html>\n`;
  return { template, to, subject, text, html };
}

/** Invitation to join a tenant, with a one-time link. */
export function invitationMail(input: {
  to: string;
  tenantName: string;
  inviterName: string;
  role: string;
  link: string;
  expiresAt: string;
}): MailMessage {
  return compose('invitation', input.to, `Join ${input.tenantName} on Tropline`, {
    paragraphs: [
      `${input.inviterName} has invited you to work on ${input.tenantName}'s food-chain ` +
        `scenarios in Tropline, as ${input.role}.`,
      'Follow the link to accept. If you are new to Tropline you will choose your name and a ' +
        'password; if you already have an account, you will confirm it with your password.',
    ],
    action: { label: 'Accept the invitation', url: input.link },
    footnote:
      `The link works once and expires at ${when(input.expiresAt)}. If you did not expect ` +
      'this invitation, ignore this message; nothing happens unless the link is used.',
  });
}

/** Password reset, with a short-lived one-time link. */
export function passwordResetMail(input: {
  to: string;
  name: string;
  link: string;
  expiresAt: string;
}): MailMessage {
  return compose('password-reset', input.to, 'Choose a new Tropline password', {
    paragraphs: [
      `Hello ${input.name},`,
      'Someone (we hope you) asked to reset the password of your Tropline account. Follow the ' +
        'link to choose a new one. Once it is set, every device signed in to your account is ' +
        'signed out.',
    ],
    action: { label: 'Choose a new password', url: input.link },
    footnote:
      `The link works once and expires at ${when(input.expiresAt)}. If you did not ask for ` +
      'this, ignore this message: your password stays as it is.',
  });
}

const KEY_VERBS = { issue: 'issued', rotate: 'rotated', revoke: 'revoked' } as const;

/** Notice to a tenant's owners and admins that a key changed. */
export function keyNoticeMail(input: {
  to: string;
  tenantName: string;
  change: keyof typeof KEY_VERBS;
  keyLabel: string;
  actor: string;
  at: string;
  consoleUrl: string;
}): MailMessage {
  const verb = KEY_VERBS[input.change];
  const consequence = {
    issue: 'Anyone holding the new key can use it within its scopes until it is revoked.',
    rotate:
      'A successor was issued; the old key keeps working until its overlap window ends, ' +
      'then stops.',
    revoke: 'Requests made with it are refused from now on.',
  }[input.change];
  return compose('key-notice', input.to, `An API key of ${input.tenantName} was ${verb}`, {
    paragraphs: [
      `The key ${input.keyLabel} was ${verb} at ${when(input.at)} by ${input.actor}.`,
      consequence,
      'If you do not recognise this change, revoke the key in the console and review the ' +
        'audit trail.',
    ],
    action: { label: 'Open the keys page', url: input.consoleUrl },
    footnote: `You receive this because you are an owner or admin of ${input.tenantName}.`,
  });
}

/** Alert that a tenant used 80 % or 100 % of its monthly compute units. */
export function quotaAlertMail(input: {
  to: string;
  tenantName: string;
  threshold: number;
  used: number;
  limit: number;
  period: string;
  resetsAt: string;
  consoleUrl: string;
  /** Sent to the tenant's contact address rather than to an owner or admin. */
  asContact?: boolean;
}): MailMessage {
  const full = input.threshold >= 100;
  return compose(
    'quota-alert',
    input.to,
    full
      ? `${input.tenantName} has used all its compute units for ${input.period}`
      : `${input.tenantName} has used ${input.threshold} % of its compute units`,
    {
      paragraphs: [
        `${input.tenantName} has used ${input.used.toLocaleString('en')} of its ` +
          `${input.limit.toLocaleString('en')} compute units for ${input.period}.`,
        full
          ? 'Requests that compute are refused until the quota resets; portals embedding ' +
            'Tropline widgets will show an error in the meantime.'
          : 'Nothing is refused yet. At 100 % requests that compute will be refused until the ' +
            'quota resets.',
        `The quota resets at ${when(input.resetsAt)}. An owner can choose a larger plan in ` +
          'the console (Tenant and plan); the units used so far carry over.',
      ],
      action: { label: 'See usage', url: input.consoleUrl },
      footnote: input.asContact
        ? `You receive this because this address is the contact for ${input.tenantName}.`
        : `You receive this because you are an owner or admin of ${input.tenantName}.`,
    },
  );
}
