/** `GET /api/dev/mailbox` (outside production): what the local fake mail server received, newest first. */
import { z } from 'zod';

export const mailboxMessageSchema = z.object({
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  sentAt: z.number(),
});
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;
