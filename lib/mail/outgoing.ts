/** A mail as the templates compose it, before the outbox gives it an id and a delivery state. */
export interface OutgoingMail {
  kind: string;
  toAddress: string;
  subject: string;
  textBody: string;
  htmlBody: string;
  headers?: Record<string, string> | null;
  /** Dedupes logically identical mails (e.g. one alert per watcher × revision). */
  dedupeKey?: string | null;
}
