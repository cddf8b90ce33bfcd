// Invented herd spreadsheets for tests and the import benchmark (no dependencies, so the bench can load it).

/** The minimum header of the herd spreadsheet format. */
export const HEADER = 'tattoo,name,sex,breed,born,sire,dam';

/** A CSV from lines (each a string or its cells), CRLF-separated like a spreadsheet's export. */
export function csv(...lines: (string | string[])[]): string {
  return lines.map((line) => (Array.isArray(line) ? line.join(',') : line)).join('\r\n') + '\r\n';
}

/** A tiny seeded generator (LCG), so a generated herd is the same on every run. */
function seeded(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

/**
 * An invented herd of `count` animals as a CSV: 30 founders of two catalogue breeds with unknown
 * parents, then generations of offspring whose parents are rows earlier in the file, each parent at
 * least 200 days older than its kit (past the first-breeding age, so no row has a warning). Every
 * tenth row carries a weight in pounds. Tattoos start with `prefix`.
 */
export function generatedHerdCsv(count: number, prefix = 'G'): string {
  const random = seeded(count * 7919 + prefix.length);
  const start = '2014-01-01';
  const span = 3600; // days, about ten years, ending before today
  const bucks: { tattoo: string; day: number }[] = [];
  const does: { tattoo: string; day: number }[] = [];
  const lines: string[] = [`${HEADER},colour,weight_lb`];
  const colours = ['White', 'Broken black', 'Chestnut', 'Californian markings', 'Blue'];
  for (let i = 0; i < count; i++) {
    const tattoo = `${prefix}${String(i + 1).padStart(5, '0')}`;
    const sex = random() < 0.5 ? 'buck' : 'doe';
    const founder = i < 30;
    const day = founder ? i : 230 + Math.floor((i / count) * (span - 230));
    let sire = '';
    let dam = '';
    let breed = i % 2 === 0 ? 'New Zealand' : 'Californian';
    if (!founder) {
      const eligible = (list: { tattoo: string; day: number }[]) => {
        let n = 0;
        while (n < list.length && list[n]!.day <= day - 200) n++;
        return n;
      };
      const b = eligible(bucks);
      const d = eligible(does);
      // Keep to the most recent breeders mostly, as a herd does.
      sire = bucks[Math.max(0, b - 1 - Math.floor(random() * Math.min(b, 40)))]!.tattoo;
      dam = does[Math.max(0, d - 1 - Math.floor(random() * Math.min(d, 120)))]!.tattoo;
      breed = 'cross';
    }
    (sex === 'buck' ? bucks : does).push({ tattoo, day });
    const weight = i % 10 === 0 ? (8 + random() * 3).toFixed(2) : '';
    lines.push([tattoo, `Kit ${i + 1}`, sex, breed, addDays(start, day), sire, dam, colours[i % colours.length]!, weight].join(','));
  }
  return lines.join('\n') + '\n';
}
