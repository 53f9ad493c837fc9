import type { ReactNode } from 'react';

// Only http(s) addresses become links, so nothing in a message can smuggle in a javascript: URL.
const urlPattern = /https?:\/\/[^\s<>"']+/g;
const closers: Record<string, string> = { ')': '(', ']': '[' };

function count(text: string, char: string): number {
  return text.split(char).length - 1;
}

/** Drops sentence punctuation after an address, and a closing bracket the address never opened. */
function trimAddress(url: string): string {
  let trimmed = url;
  for (;;) {
    const last = trimmed.at(-1) ?? '';
    const opener = closers[last];
    if ('.,;:!?'.includes(last) && last !== '') trimmed = trimmed.slice(0, -1);
    else if (opener !== undefined && count(trimmed, last) > count(trimmed, opener))
      trimmed = trimmed.slice(0, -1);
    else return trimmed;
  }
}

export type TextPiece = { kind: 'text' | 'link'; value: string };

/** Splits text into plain runs and http(s) links. */
export function splitLinks(text: string): TextPiece[] {
  const pieces: TextPiece[] = [];
  let last = 0;
  for (const match of text.matchAll(urlPattern)) {
    const start = match.index;
    const url = trimAddress(match[0]);
    if (start > last) pieces.push({ kind: 'text', value: text.slice(last, start) });
    pieces.push({ kind: 'link', value: url });
    last = start + url.length;
  }
  if (last < text.length) pieces.push({ kind: 'text', value: text.slice(last) });
  return pieces;
}

export interface LinkifiedTextProps {
  text: string;
}

export function LinkifiedText({ text }: LinkifiedTextProps): ReactNode {
  return splitLinks(text).map((piece, index) =>
    piece.kind === 'link' ? (
      <a
        key={index}
        href={piece.value}
        target="_blank"
        rel="noopener noreferrer"
        className="font-semibold [overflow-wrap:anywhere] text-frost-700 underline hover:text-frost-900"
      >
        {piece.value}
      </a>
    ) : (
      <span key={index}>{piece.value}</span>
    ),
  );
}
