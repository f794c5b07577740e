import type { Role } from '#shared/schemas/common.ts';

/** The account mails (our own wording). Plain text first: every mail client shows it. */
type Mail = { subject: string; text: string; html: string };

const roleWords: Record<Role, string> = {
  nurse: 'nurse',
  endoscopist: 'endoscopist',
  supervisor: 'supervisor (quality lead)',
  admin: 'unit administrator',
};

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export function invitationMail(p: { url: string; unitName: string; hospital: string; role: Role; inviterName: string }): Mail {
  const where = p.hospital ? `${p.unitName}, ${p.hospital}` : p.unitName;
  const text = [
    `${p.inviterName} has invited you to join ${where} on Ledgerline as ${roleWords[p.role]}.`,
    '',
    `Open this link to choose your password and join: ${p.url}`,
    '',
    'The invitation expires in 7 days. If you did not expect it, ignore this mail.',
  ].join('\n');
  const html = `<p>${escapeHtml(p.inviterName)} has invited you to join <strong>${escapeHtml(where)}</strong> on Ledgerline as ${escapeHtml(roleWords[p.role])}.</p>`
    + `<p><a href="${escapeHtml(p.url)}">Choose your password and join</a></p><p>The invitation expires in 7 days. If you did not expect it, ignore this mail.</p>`;
  return { subject: `Invitation to ${where} on Ledgerline`, text, html };
}

export function resetPasswordMail(p: { name: string; url: string }): Mail {
  const text = [
    `Hello ${p.name},`,
    '',
    `Someone asked to reset your Ledgerline password. To choose a new one, open: ${p.url}`,
    '',
    'The link works once and expires in one hour. If you did not ask, ignore this mail; your password stays as it is.',
  ].join('\n');
  const html = `<p>Hello ${escapeHtml(p.name)},</p><p>Someone asked to reset your Ledgerline password.</p>`
    + `<p><a href="${escapeHtml(p.url)}">Choose a new password</a></p><p>The link works once and expires in one hour. If you did not ask, ignore this mail.</p>`;
  return { subject: 'Reset your Ledgerline password', text, html };
}
