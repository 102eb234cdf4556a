import { describe, expect, test } from 'vitest';
import { escapeHtml, invitationMail, passwordResetMail } from '../../../src/lib/server/mail/templates';

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

  test('escapeHtml covers the five HTML-significant characters (common practice, OWASP XSS cheat sheet)', () => {
    expect(escapeHtml(`<a href="x" onclick='y'>&</a>`)).toBe('&lt;a href=&quot;x&quot; onclick=&#39;y&#39;&gt;&amp;&lt;/a&gt;');
  });
});
