/** A message as the development mailbox lists it. */
export interface CaughtMail {
  readonly id: number;
  readonly from: string;
  readonly to: readonly string[];
  readonly subject: string;
  readonly text: string;
  readonly html: string;
  readonly template?: string;
  readonly receivedAt: string;
}

/** What a link in a caught mail is for, in words, when it leads back into the console. */
export interface MailLink {
  readonly href: string;
  readonly label: string;
}

const PURPOSES: readonly [RegExp, string][] = [
  [/\/console\/invitation\?/, 'Open the invitation'],
  [/\/console\/password-reset\?/, 'Open the password link'],
];

/**
 * The web links in a message's plain text, in order, once each, trailing punctuation dropped.
 * The mail's HTML is shown sandboxed (links inert), so these are how a developer follows one.
 */
export function linksIn(text: string): MailLink[] {
  const found = text.match(/https?:\/\/[^\s<>"')\]]+/g) ?? [];
  const unique = [...new Set(found.map((u) => u.replace(/[.,;:!?]+$/, '')))];
  return unique.map((href) => ({
    href,
    label: PURPOSES.find(([re]) => re.test(href))?.[1] ?? href,
  }));
}
