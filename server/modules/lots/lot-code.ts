/** A readable code from the species and season, e.g. Tomato 2025 → TOM-25-03. */
export function codePrefix(commonName: string, season: number): string {
  const words = commonName
    .normalize('NFD')
    .replace(/[^A-Za-z\s]/g, '')
    .toUpperCase()
    .split(/\s+/)
    .filter(Boolean);
  const first = words[0] ?? 'LOT';
  const letters =
    words.length > 1 ? `${first[0]}${(words[words.length - 1] ?? '').slice(0, 2)}` : first.slice(0, 3);
  return `${letters.padEnd(3, 'X')}-${String(season % 100).padStart(2, '0')}-`;
}

/** The next free number after the codes that already use `prefix`. */
export function nextCode(prefix: string, existing: string[]): string {
  let highest = 0;
  for (const code of existing) {
    const n = Number.parseInt(code.slice(prefix.length), 10);
    if (code.toUpperCase().startsWith(prefix) && Number.isFinite(n)) highest = Math.max(highest, n);
  }
  return `${prefix}${String(highest + 1).padStart(2, '0')}`;
}
