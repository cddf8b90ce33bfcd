/** "12.50" or "12,50" typed in the currency's units → integer cents; NaN for anything else, which the schema refuses. */
export function centsFromText(text: string): number {
  const clean = text.trim().replace(/[$€£\s]/g, '').replace(',', '.');
  if (!/^\d+(\.\d{1,2})?$/.test(clean)) return Number.NaN;
  const [whole, part = ''] = clean.split('.');
  return Number(whole) * 100 + Number(part.padEnd(2, '0'));
}
