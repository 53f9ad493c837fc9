import { describe, expect, it } from 'vitest';
import { monthInWords } from '#shared/day-words';
import { renderPacketGone, renderPacketPage } from '#server/modules/packet/packet-html';
import type { PacketContent } from '#server/modules/packet/packet.service';
import { lotPathFromCode, packetTokenFromCode } from '#src/features/scan/lot-link';

// Invented content; the page is checked as a browser would read it.
const base: PacketContent = {
  speciesName: 'Tomato',
  scientificName: 'Solanum lycopersicum',
  variety: '<b>Bold</b> & "Quoted" <script>alert(1)</script>',
  harvest: 'Harvested in 2025',
  lastTest: { percent: 82, estimated: false, running: false, month: 'Feb 2026' },
  sowing: ['Sow as usual.'],
  cautions: [{ title: 'Treated seed: handle with care', text: 'Wear gloves & wash <hands>.' }],
};

describe('month and year in words', () => {
  it('when a test date is written for a packet, then it reads short month and year (the Gregorian calendar)', () => {
    expect(monthInWords('2026-02-14')).toBe('Feb 2026');
    expect(monthInWords('2026-12-31')).toBe('Dec 2026');
    expect(monthInWords('not a date')).toBe('not a date');
  });
});

describe('the packet page as HTML', () => {
  it('when the variety or a caution holds markup, then it is text on the page, never markup', () => {
    const html = renderPacketPage(base);
    expect(html).not.toContain('<script>');
    expect(html).not.toContain('<b>Bold</b>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('Wear gloves &amp; wash &lt;hands&gt;.');
  });

  it('when rendered, then it is a phone-width, noindex page in English with its own font and no script', () => {
    const html = renderPacketPage(base);
    expect(html.startsWith('<!doctype html>')).toBe(true);
    expect(html).toContain('<html lang="en">');
    expect(html).toContain('<meta name="viewport" content="width=device-width, initial-scale=1">');
    expect(html).toContain('<meta name="robots" content="noindex, nofollow">');
    expect(html).toMatch(/font-family:'Source Sans 3'/);
    expect(html).toMatch(/src:url\(\/packet-assets\/source-sans-3-latin-400-normal\.woff2\)/);
    expect(html).not.toMatch(/https?:\/\//);
    expect(html).not.toMatch(/<script\b/);
  });

  it('when the seed was sown by estimate or the test runs, then the figure says about or so far', () => {
    const about = renderPacketPage({ ...base, lastTest: { ...base.lastTest!, estimated: true } });
    expect(about).toContain('<b>about 82%</b> came up in the latest germination test, Feb 2026');
    const running = renderPacketPage({ ...base, lastTest: { ...base.lastTest!, running: true } });
    expect(running).toContain('came up so far in a germination test started in Feb 2026');
    expect(renderPacketPage({ ...base, lastTest: null })).toContain('Not tested for germination yet');
  });

  it('when the page is gone, then it says so without naming anything', () => {
    const html = renderPacketGone();
    expect(html).toContain('This packet page is not available');
    expect(html).toContain('noindex');
  });
});

describe('reading a scanned code as a packet page', () => {
  const token = 'AbCdEfGhIjKlMnOpQrStUvWxYz0123456789-_AbCdE';

  it('when the code is a packet page of this server or another, then the scanner reads its token', () => {
    expect(token).toHaveLength(43);
    for (const origin of ['https://hilum.example.org', 'http://127.0.0.1:3000'])
      expect(packetTokenFromCode(`${origin}/p/${token}`)).toBe(token);
    expect(packetTokenFromCode(`https://hilum.example.org/p/${token}/\n`)).toBe(token);
    expect(lotPathFromCode(`https://hilum.example.org/p/${token}`)).toBeNull();
  });

  it('when the code is anything else, then it is no packet page', () => {
    for (const text of [
      `https://hilum.example.org/p/${token}x`,
      `https://hilum.example.org/p/short`,
      `https://hilum.example.org/q/${token}`,
      `javascript:alert(1)//p/${token}`,
      'TOM-25-01',
      '',
    ])
      expect(packetTokenFromCode(text), text).toBeNull();
  });
});
