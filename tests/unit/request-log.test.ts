import { describe, expect, it } from 'vitest';
import { redactUrl } from '#server/http/request-log';

describe('URLs as the request log writes them', () => {
  it('when a link carries a token, then its value is replaced and the rest kept', () => {
    expect(redactUrl('/reset-password?token=abc_DEF-123')).toBe('/reset-password?token=[redacted]');
    expect(redactUrl('/invitations/accept?token=abc&from=mail')).toBe(
      '/invitations/accept?token=[redacted]&from=mail',
    );
    expect(redactUrl('/verify-email?lang=en&token=abc#top')).toBe('/verify-email?lang=en&token=[redacted]');
  });

  it('when a parameter is named like a token, a password or a secret, however written, then it is replaced', () => {
    expect(redactUrl('/x?access_token=a&resetToken=b&PASSWORD=c&client_secret=d&%74oken=e')).toBe(
      '/x?access_token=[redacted]&resetToken=[redacted]&PASSWORD=[redacted]&client_secret=[redacted]&%74oken=[redacted]',
    );
    expect(redactUrl('/x?token=a&token=b')).toBe('/x?token=[redacted]&token=[redacted]');
  });

  it('when the address has no secret, then it is logged as it came', () => {
    for (const url of [
      '/api/banks/1/lots?limit=50&cursor=abc',
      '/api/health',
      '/x?q=%E0%A4%A',
      '/x?token',
      '/x?',
    ])
      expect(redactUrl(url)).toBe(url);
  });
});
