/** Invitation links: what `GET /api/invitations/:token` shows, and what accepting returns. */
import { z } from 'zod';
import { apiRoleSchema } from './common';

export const invitationStateSchema = z.enum(['pending', 'expired', 'used']);
export type InvitationState = z.infer<typeof invitationStateSchema>;

export const invitationPreviewSchema = z.object({
  roomName: z.string(),
  role: apiRoleSchema,
  /** The address the invitation is for: accept while signed in with it. */
  email: z.string(),
  invitedBy: z.object({ displayName: z.string() }).nullable(),
  expiresAt: z.number(),
  state: invitationStateSchema,
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

export const invitationAcceptResultSchema = z.object({
  roomId: z.string(),
  role: apiRoleSchema,
  /** true when the account was already a member (its role is kept). */
  alreadyMember: z.boolean(),
});
export type InvitationAcceptResult = z.infer<typeof invitationAcceptResultSchema>;

/** The 202 of `POST /api/rooms/:id/members` for an address without an account. */
export const invitationSentSchema = z.object({
  invited: z.literal(true),
  id: z.string(),
  email: z.string(),
  role: apiRoleSchema,
  expiresAt: z.number(),
  /** false when the mail server refused the message (the invitation is kept; invite again to resend). */
  mailSent: z.boolean(),
});
export type InvitationSent = z.infer<typeof invitationSentSchema>;
