/**
 * Advance widths of Source Sans 3 (the face the label embeds), in thousandths of an em, for the
 * printable ASCII characters U+0020…U+007E. Measured once from the @fontsource 5.3.1 latin files
 * in Chromium's canvas; kerning is left out, which keeps an estimate on the wide side.
 */
// prettier-ignore
const REGULAR = [
  200, 289, 426, 497, 497, 824, 609, 249, 303, 303, 418, 497, 249, 311, 249, 350, 497, 497, 497, 497,
  497, 497, 497, 497, 497, 497, 249, 249, 497, 497, 497, 425, 847, 543, 588, 571, 615, 527, 494, 617,
  652, 263, 479, 579, 486, 727, 647, 664, 566, 664, 569, 534, 536, 645, 515, 786, 513, 476, 539, 303,
  350, 303, 497, 500, 542, 504, 553, 456, 555, 496, 292, 504, 544, 246, 247, 495, 255, 829, 547, 542,
  555, 555, 347, 419, 338, 544, 467, 719, 446, 467, 425, 303, 241, 303, 497,
];
// prettier-ignore
const BOLD = [
  200, 340, 537, 528, 528, 857, 667, 300, 344, 344, 457, 528, 300, 332, 300, 339, 528, 528, 528, 528,
  528, 528, 528, 528, 528, 528, 300, 300, 528, 528, 528, 463, 902, 573, 605, 582, 635, 548, 524, 638,
  674, 301, 509, 614, 518, 762, 665, 684, 596, 684, 613, 556, 556, 665, 556, 813, 567, 525, 541, 344,
  339, 344, 528, 500, 555, 527, 573, 468, 573, 518, 341, 534, 571, 276, 278, 548, 286, 857, 572, 555,
  573, 573, 398, 443, 383, 568, 523, 776, 514, 521, 460, 344, 268, 344, 528,
];
/** Accented letters and typographic marks measured the same way averaged about this much; CJK (from U+2E80) is a full em. */
const OTHER = { 400: 520, 700: 560 } as const;
const WIDE = 1000;

export type Weight = 400 | 700;

/** The estimated width of `text` set at `size` (any unit; the result is in the same unit). */
export function textWidth(text: string, size: number, weight: Weight = 400): number {
  const table = weight === 700 ? BOLD : REGULAR;
  let total = 0;
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if (code >= 0x20 && code <= 0x7e) total += table[code - 0x20]!;
    else if (code >= 0x2e80) total += WIDE;
    else total += OTHER[weight];
  }
  return (total / 1000) * size;
}
