import { describe, expect, test } from 'vitest';
import { escapeHtml, invitationMail, passwordResetMail, verifyEmailMail } from '../../../src/lib/server/mail/templates';

describe('mail templates', () => {
  test('the invitation carries the link in both parts and escapes names in HTML', () => {
    const m = invitationMail({
      teamName: 'Ridge <Team> & "Co"',
      inviterName: 'Ines',
      role: 'editor',
      url: 'https://armilla.example/invitations/abc',
      expiresAt: new Date('2026-03-27T12:00:00Z'),
    });
    expect(m.text).toContain('https://armilla.example/invitations/abc');
    expect(m.html).toContain('href="https://armilla.example/invitations/abc"');
    expect(m.html).toContain('Ridge &lt;Team&gt; &amp; &quot;Co&quot;');
    expect(m.html).not.toContain('<Team>');
    expect(m.text).toContain('2026-03-27 12:00 UTC');
  });

  test('the reset mail states the validity and the link', () => {
    const m = passwordResetMail({ name: 'Priya', url: 'https://armilla.example/reset/t0k', validMinutes: 60 });
    expect(m.subject).toMatch(/reset/i);
    expect(m.text).toContain('https://armilla.example/reset/t0k');
    expect(m.text).toContain('60 minutes');
    expect(m.html).toContain('https://armilla.example/reset/t0k');
  });

  test('names chosen by users stay out of every subject and reach the body as one bounded line (issue 17, finding 6)', () => {
    // A display name written to pass for the service's own words, with a header-like second line and padding.
    const hostile = 'URGENT: your mailbox is full, visit https://mbx.example/fix\r\nBcc: someone@victim.example\n' + 'x'.repeat(400);
    const url = 'https://armilla.example/t/abc';
    const mails = [
      invitationMail({ teamName: hostile, inviterName: hostile, role: 'viewer', url, expiresAt: new Date('2026-03-27T12:00:00Z') }),
      passwordResetMail({ name: hostile, url, validMinutes: 60 }),
      verifyEmailMail({ name: hostile, url, validHours: 48 }),
    ];
    for (const m of mails) {
      expect(m.subject).not.toMatch(/URGENT|visit|mbx\.example|[\r\n]/);
      expect(m.subject.length).toBeLessThan(60);
      for (const part of [m.text, m.html]) {
        expect(part).not.toMatch(/^\s*Bcc:/m); // the name's second line never becomes a line of its own
        expect(part).not.toContain('x'.repeat(60));
      }
      const line = m.text.split('\n').find((l) => l.includes('URGENT'))!;
      expect(line).toContain('https://mbx.example/fix…');
    }
  });

  test('escapeHtml covers the five HTML-significant characters (common practice, OWASP XSS cheat sheet)', () => {
    expect(escapeHtml(`<a href="x" onclick='y'>&</a>`)).toBe('&lt;a href=&quot;x&quot; onclick=&#39;y&#39;&gt;&amp;&lt;/a&gt;');
  });
});
