import crypto from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { lotPageUrl } from '#server/modules/labels/labels.service';
import { lotPathFromCode } from '#src/features/scan/lot-link';

// What the scanner does with a QR code's text: the lot page a Hilum packet label's code holds
// (the server writes it with lotPageUrl), or nothing for any other code.
describe('reading a scanned code as a lot page', () => {
  const bankId = crypto.randomUUID();
  const lotId = crypto.randomUUID();
  const path = `/banks/${bankId}/lots/${lotId}`;

  it('when the code is a label printed by this server or another, then it opens that lot here', () => {
    for (const origin of ['https://hilum.example.org', 'http://127.0.0.1:3000', 'https://seeds.example.net/'])
      expect(lotPathFromCode(lotPageUrl(origin, bankId, lotId))).toEqual({ bankId, lotId, path });
    // A scanner may hand over the text with a stray newline or a trailing slash.
    expect(lotPathFromCode(`${lotPageUrl('https://hilum.example.org', bankId, lotId)}/\n`)?.path).toBe(path);
  });

  it('when the code is anything else, then it is not read as a lot', () => {
    for (const text of [
      'TOM-25-01',
      'https://example.org/',
      `https://hilum.example.org/banks/${bankId}/lots`,
      `https://hilum.example.org/banks/${bankId}/lots/${lotId}/tests/new`,
      `https://hilum.example.org/banks/${bankId}/lots/not-an-id`,
      `javascript:alert(1)//banks/${bankId}/lots/${lotId}`,
      `ftp://hilum.example.org/banks/${bankId}/lots/${lotId}`,
      `https://hilum.example.org/banks/%E0%A4%A/lots/${lotId}`,
      '',
    ])
      expect(lotPathFromCode(text), text).toBeNull();
  });
});
