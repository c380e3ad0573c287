/** One e-mail as the outbox keeps it: both parts are always present. */
export interface MailMessage {
  /** Which template made it, e.g. `invitation` (kept for the outbox and the dev mailbox). */
  readonly template: string;
  readonly to: string;
  readonly subject: string;
  /** The plain-text part. */
  readonly text: string;
  /** The HTML part. */
  readonly html: string;
}
