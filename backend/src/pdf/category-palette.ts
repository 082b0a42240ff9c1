/**
 * The exposure-category scale 0–4 as the PDFs print it: the app's own sequential palette
 * (frontend/src/styles.css `--category-N`, given there in OKLCH and converted here to sRGB hex with the
 * OKLab → linear sRGB matrices of Ottosson, 2020, "A perceptual color space for image processing"),
 * the ink that stays readable on each step, and the word always printed beside the colour
 * (frontend/src/components/category-badge.tsx; PRODUCT.md "Look and feel": never colour alone).
 * The backend cannot import the frontend, so these few values are repeated on purpose.
 */
export const categoryScale = [
  { category: 0, word: 'Very low', band: 'below 1% of the OEL', fill: '#f4f1c3', ink: '#312e1d' },
  { category: 1, word: 'Low', band: '1% to 10% of the OEL', fill: '#f5d073', ink: '#382c15' },
  { category: 2, word: 'Moderate', band: '10% to 50% of the OEL', fill: '#f09b48', ink: '#341a09' },
  { category: 3, word: 'High', band: '50% to 100% of the OEL', fill: '#cd5630', ink: '#fcfcfc' },
  { category: 4, word: 'Above the limit', band: 'above the OEL', fill: '#84253d', ink: '#fcfcfc' },
] as const;

/** "2 · Moderate": number and word of a category. */
export function categoryLabel(category: number): string {
  const entry = categoryScale[category];
  if (!entry) throw new RangeError(`categoryLabel: category must be an integer from 0 to 4, got ${category}`);
  return `${entry.category} · ${entry.word}`;
}
