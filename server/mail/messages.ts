/**
 * The mail Matchloom sends, in the product's words: an invitation to a room, and a request to review a
 * snapshot. Plain text first (the HTML part says the same, escaped). Pure functions.
 */
import type { Role } from '../auth/tokens';
import type { OutgoingMail } from './mailer';
import type { DesignFigures } from '../services/figures';
import { formatEngineering } from '../../shared/rf/units';

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (edit, snapshot, branch, invite and change roles)',
  tuner: 'a tuner (edit the chain, load, band and goal; snapshot; branch)',
  observer: 'an observer (watch live, follow a tuner’s view and leave review notes)',
};

function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );
}

/** `2026-12-22 14:05 UTC` */
export function formatUtc(ms: number): string {
  return `${new Date(ms).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** Paragraphs of text; a paragraph that is a URL becomes a link in the HTML part. */
function mail(to: string, subject: string, paragraphs: string[]): OutgoingMail {
  const text = `${paragraphs.join('\n\n')}\n`;
  const html = paragraphs
    .map((p) =>
      /^https?:\/\/\S+$/.test(p)
        ? `<p><a href="${escapeHtml(p)}">${escapeHtml(p)}</a></p>`
        : `<p>${escapeHtml(p).replace(/\n/g, '<br>')}</p>`,
    )
    .join('\n');
  return {
    to,
    subject,
    text,
    html: `<!doctype html>\n<html><body style="font-family: sans-serif">\n${html}\n</body></html>\n`,
  };
}

export function invitationMail(input: {
  to: string;
  roomName: string;
  role: Role;
  inviterName: string | null;
  link: string;
  expiresAt: number;
}): OutgoingMail {
  const who = input.inviterName ?? 'A Matchloom user';
  return mail(input.to, `Join the room “${input.roomName}” on Matchloom`, [
    `${who} invites you to the Matchloom room “${input.roomName}” as ${ROLE_WORDS[input.role]}.`,
    'Accept the invitation here:',
    input.link,
    `The link works once, until ${formatUtc(input.expiresAt)}. Sign in, or create an account, with this address (${input.to}) to accept it.`,
    'If you did not expect this invitation, you can ignore this message.',
  ]);
}

function figuresLine(f: DesignFigures | null): string | null {
  if (!f || !f.analysed || !f.worstInBand) return null;
  const parts = [`${f.partCount} part${f.partCount === 1 ? '' : 's'}`];
  if (f.worstInBand.vswr !== null) parts.push(`worst in-band VSWR ${f.worstInBand.vswr.toFixed(2)}`);
  if (f.worstInBand.returnLossDb !== null)
    parts.push(`return loss ${f.worstInBand.returnLossDb.toFixed(1)} dB`);
  if (f.bandwidth) parts.push(`bandwidth ${formatEngineering(f.bandwidth.highHz - f.bandwidth.lowHz, 'Hz')}`);
  if (f.goalMet !== null) parts.push(f.goalMet ? 'goal met' : 'goal not met');
  return `Headline figures: ${parts.join(', ')}.`;
}

export function reviewRequestMail(input: {
  to: string;
  roomName: string;
  snapshotLabel: string;
  requesterName: string | null;
  figures: DesignFigures | null;
  link: string;
}): OutgoingMail {
  const who = input.requesterName ?? 'A member of the room';
  const figures = figuresLine(input.figures);
  return mail(input.to, `Review requested: “${input.snapshotLabel}” in ${input.roomName}`, [
    `${who} marked the snapshot “${input.snapshotLabel}” of the room “${input.roomName}” for review.`,
    ...(figures ? [figures] : []),
    'Open the room to compare it and leave notes:',
    input.link,
    'You get this message because review e-mails are on for your Matchloom account; you can turn them off in your account settings.',
  ]);
}
