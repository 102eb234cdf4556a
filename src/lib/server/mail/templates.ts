/** Text and HTML bodies of the mails the app sends. Every interpolated value is escaped in the HTML part. */

export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** A plain, table-free HTML shell that reads well in mail clients and in dark mode. */
function shell(title: string, bodyHtml: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="margin:0;padding:24px;background:#f4f1ea;font-family:Helvetica,Arial,sans-serif;color:#14213d;">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border-radius:8px;padding:24px;border-top:4px solid #b08a3e;">
<p style="margin:0 0 16px;font-weight:bold;letter-spacing:0.08em;color:#14213d;">ARMILLA</p>
${bodyHtml}
<p style="margin:24px 0 0;font-size:12px;color:#55607a;">You received this because someone used this address on Armilla. If it was not you, ignore this mail.</p>
</div></body></html>`;
}

function button(url: string, label: string): string {
  return `<p style="margin:24px 0;"><a href="${escapeHtml(url)}" style="display:inline-block;background:#14213d;color:#ffffff;padding:12px 20px;border-radius:6px;text-decoration:none;font-weight:bold;">${escapeHtml(label)}</a></p>
<p style="font-size:12px;color:#55607a;word-break:break-all;">Or open this address: ${escapeHtml(url)}</p>`;
}

const ROLE_WORDS: Record<string, string> = {
  owner: 'an owner (manages members and everything else)',
  editor: 'an editor (builds and shares scenes)',
  reviewer: 'a reviewer (checks scenes and comments on them)',
  viewer: 'a viewer (watches scenes read-only)',
};

/**
 * A name chosen by a user, as it may appear in a mail's body: one line, no control characters, at most
 * `max` characters. Subjects never carry one (issue 17: a display name such as "URGENT: your mailbox is
 * full, visit …" read as the mail's own words).
 */
export function oneLine(s: string, max = 80): string {
  // eslint-disable-next-line no-control-regex
  const flat = s.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ').replace(/\s+/g, ' ').trim();
  return flat.length > max ? `${flat.slice(0, max - 1)}…` : flat;
}

export function invitationMail(p: { teamName: string; inviterName: string; role: string; url: string; expiresAt: Date }): RenderedMail {
  // The subject is ours alone: names chosen by users go in the body, quoted and bounded.
  const subject = 'An invitation to a team on Armilla';
  const inviter = oneLine(p.inviterName, 60);
  const team = oneLine(p.teamName, 80);
  const roleText = ROLE_WORDS[p.role] ?? p.role;
  const until = p.expiresAt.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
  const text = [
    `The Armilla user “${inviter}” invited you to join the team “${team}” as ${roleText}.`,
    '',
    'Accept the invitation here (sign in or create an account with this e-mail address first):',
    p.url,
    '',
    `The link works once and until ${until}.`,
  ].join('\n');
  const html = shell(
    subject,
    `<h1 style="font-size:20px;margin:0 0 12px;">An invitation to a team</h1>
<p>The Armilla user “${escapeHtml(inviter)}” invited you to join the team <strong>“${escapeHtml(team)}”</strong> as ${escapeHtml(roleText)}.</p>
${button(p.url, 'Accept the invitation')}
<p>Sign in or create an account with this e-mail address first. The link works once and until ${escapeHtml(until)}.</p>`,
  );
  return { subject, text, html };
}

export function passwordResetMail(p: { name: string; url: string; validMinutes: number }): RenderedMail {
  const subject = 'Reset your Armilla password';
  const name = oneLine(p.name, 60);
  const text = [
    `Hello ${name},`,
    '',
    'Someone asked to reset the password of your Armilla account. Choose a new password here:',
    p.url,
    '',
    `The link works once and for ${p.validMinutes} minutes. Setting a new password signs you out everywhere else.`,
    'If you did not ask for this, ignore this mail: your password stays as it is.',
  ].join('\n');
  const html = shell(
    subject,
    `<h1 style="font-size:20px;margin:0 0 12px;">Reset your password</h1>
<p>Hello ${escapeHtml(name)},</p>
<p>Someone asked to reset the password of your Armilla account.</p>
${button(p.url, 'Choose a new password')}
<p>The link works once and for ${p.validMinutes} minutes. Setting a new password signs you out everywhere else.
If you did not ask for this, ignore this mail: your password stays as it is.</p>`,
  );
  return { subject, text, html };
}

export function verifyEmailMail(p: { name: string; url: string; validHours: number }): RenderedMail {
  const subject = 'Confirm your e-mail address for Armilla';
  const name = oneLine(p.name, 60);
  const text = [
    `Hello ${name},`,
    '',
    'Confirm that this address is yours by opening this link:',
    p.url,
    '',
    `The link works for ${p.validHours} hours. Until then you cannot accept team invitations or receive comment notices.`,
    'If you did not create an Armilla account, ignore this mail.',
  ].join('\n');
  const html = shell(
    subject,
    `<h1 style="font-size:20px;margin:0 0 12px;">Confirm your address</h1>
<p>Hello ${escapeHtml(name)},</p>
<p>Confirm that this address is yours.</p>
${button(p.url, 'Confirm my address')}
<p>The link works for ${p.validHours} hours. Until then you cannot accept team invitations or receive comment notices.</p>`,
  );
  return { subject, text, html };
}
