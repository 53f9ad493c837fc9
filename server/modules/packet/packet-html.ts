import { escapeMarkup as esc } from '../labels/labels.service';
import type { PacketContent } from './packet.service';

/** Where the page's own font files are served (packet.router.ts): from this server, never a font host. */
export const PACKET_FONT_PATH = '/packet-assets';
export const packetFontFile = (weight: 400 | 700) => `source-sans-3-latin-${weight}-normal.woff2`;

// The app's earthy palette (tailwind.config.ts): loam-900 text on husk-50, moss-800 headings,
// seedcoat-100/800 cautions — each pair 8:1 or better.
const CSS = `
@font-face{font-family:'Source Sans 3';font-style:normal;font-weight:400;font-display:swap;src:url(${PACKET_FONT_PATH}/${packetFontFile(400)}) format('woff2')}
@font-face{font-family:'Source Sans 3';font-style:normal;font-weight:700;font-display:swap;src:url(${PACKET_FONT_PATH}/${packetFontFile(700)}) format('woff2')}
*{box-sizing:border-box}
html{-webkit-text-size-adjust:100%;text-size-adjust:100%}
body{margin:0;background:#fcfaf4;color:#2a241e;font-family:'Source Sans 3','Source Sans Pro','Helvetica Neue',Arial,sans-serif;font-size:1.125rem;line-height:1.5}
main{max-width:36rem;margin:0 auto;padding:1.25rem 1rem 2.5rem}
.brand{margin:0 0 1rem;color:#635645;font-size:.95rem;letter-spacing:.02em}
.brand b{color:#b5742c}
h1{margin:0;color:#324520;font-size:1.9rem;line-height:1.15;overflow-wrap:anywhere}
.sci{margin:.2rem 0 0;color:#4e4337;font-style:italic}
.facts{margin:1rem 0 0;padding:0;list-style:none;display:grid;gap:.5rem}
.facts li{background:#fff;border:1px solid #dcd2c3;border-radius:.6rem;padding:.6rem .8rem}
.facts b{font-size:1.35rem;color:#2a241e}
h2{margin:1.6rem 0 .5rem;color:#324520;font-size:1.25rem}
.advice{margin:0;padding-left:1.2rem}
.advice li{margin:.25rem 0}
.caution{margin:.6rem 0 0;background:#f5e6cf;border:1px solid #deab66;border-radius:.6rem;padding:.7rem .9rem;color:#5f3b1c}
.caution h3{margin:0 0 .2rem;font-size:1.05rem}
.caution p{margin:0}
footer{margin-top:2rem;color:#635645;font-size:.95rem}
`;

function page(title: string, body: string): string {
  return [
    '<!doctype html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    // A packet page is shared by hand (a label's QR code), never to be found by search engines.
    '<meta name="robots" content="noindex, nofollow">',
    '<meta name="referrer" content="no-referrer">',
    `<title>${esc(title)}</title>`,
    `<style>${CSS}</style>`,
    '</head>',
    `<body><main>${body}</main></body>`,
    '</html>',
  ].join('\n');
}

const BRAND = '<p class="brand"><b>●</b> Hilum · seed packet</p>';

function testWords(t: NonNullable<PacketContent['lastTest']>): string {
  const figure = `${t.estimated ? 'about ' : ''}${t.percent}%`;
  return t.running
    ? `<b>${esc(figure)}</b> came up so far in a germination test started in ${esc(t.month)}`
    : `<b>${esc(figure)}</b> came up in the latest germination test, ${esc(t.month)}`;
}

/** A lot's public packet page, as a whole HTML document that needs no script and no sign-in. */
export function renderPacketPage(c: PacketContent): string {
  const name = c.variety.trim() ? `${c.speciesName} ‘${c.variety.trim()}’` : c.speciesName;
  const facts = [
    c.harvest ? `<li>${esc(c.harvest)}</li>` : '',
    `<li>${c.lastTest ? testWords(c.lastTest) : 'Not tested for germination yet'}</li>`,
  ].join('');
  const cautions = c.cautions
    .map(
      (k) => `<section class="caution" role="note"><h3>${esc(k.title)}</h3><p>${esc(k.text)}</p></section>`,
    )
    .join('');
  const body = [
    BRAND,
    `<h1>${esc(c.speciesName)}${c.variety.trim() ? `<br>${esc(c.variety.trim())}` : ''}</h1>`,
    c.scientificName ? `<p class="sci">${esc(c.scientificName)}</p>` : '',
    `<ul class="facts" aria-label="About this seed">${facts}</ul>`,
    '<h2>Sowing</h2>',
    `<ul class="advice">${c.sowing.map((s) => `<li>${esc(s)}</li>`).join('')}</ul>`,
    cautions ? `<h2>Cautions</h2>${cautions}` : '',
    '<footer>Shared from a home seed bank kept with Hilum. The grower can turn this page off at any time.</footer>',
  ].join('\n');
  return page(`${name} · seed packet`, body);
}

/** The page a turned-off, re-issued or unknown address shows, with its 404. */
export function renderPacketGone(): string {
  return page(
    'Packet page not available · Hilum',
    `${BRAND}<h1>This packet page is not available</h1><p>The grower may have turned it off or made a new one. Ask them for the packet’s current label.</p>`,
  );
}
