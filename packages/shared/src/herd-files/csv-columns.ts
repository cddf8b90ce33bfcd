import { GRAMS_PER_OUNCE, GRAMS_PER_POUND, type WeightUnit } from '../units/units';

/**
 * The herd spreadsheet format (our own): one animal per row, the first line names the columns.
 *
 * Minimum: `tattoo,name,sex,breed,born,sire,dam`. Extra columns are mapped when present; a weight
 * column names its unit in the header (`weight_lb`, `weight_oz`, `weight_kg`, `weight_g`), so a file
 * written in pounds reads the same on a farm that keeps kilograms. The export adds computed columns
 * (`status`, `coi_percent`, `breed_makeup`, `age_class`); an import recognises and ignores them, so
 * an exported file can be imported again.
 */
export const requiredImportColumns = ['tattoo', 'name', 'sex', 'breed', 'born', 'sire', 'dam'] as const;
export type RequiredImportColumn = (typeof requiredImportColumns)[number];

export const optionalImportColumns = ['colour', 'registration', 'hutch', 'notes', 'weighed', 'bred_by', 'arrived'] as const;
export type OptionalImportColumn = (typeof optionalImportColumns)[number];

export const weightColumns = ['weight_lb', 'weight_oz', 'weight_kg', 'weight_g'] as const;
export type WeightColumn = (typeof weightColumns)[number];

/** What the export computes; an import reads past them. */
export const computedExportColumns = ['status', 'coi_percent', 'breed_makeup', 'age_class'] as const;

/** A column the import reads: the required ones, the optional ones, and the one weight column. */
export type ImportField = RequiredImportColumn | OptionalImportColumn | 'weight';

export const gramsPerWeightUnit: Record<WeightColumn, number> = {
  weight_lb: GRAMS_PER_POUND,
  weight_oz: GRAMS_PER_OUNCE,
  weight_kg: 1000,
  weight_g: 1,
};

/** The weight column of a farm's export: decimal pounds or kilograms, as the farm keeps them. */
export function exportWeightColumn(unit: WeightUnit): WeightColumn {
  return unit === 'kg_g' ? 'weight_kg' : 'weight_lb';
}

/** Spellings people use for the same column (spreadsheets differ; US and UK English too). */
const aliases: Record<string, string> = {
  color: 'colour',
  registration_number: 'registration',
  registration_no: 'registration',
  reg_no: 'registration',
  weighed_on: 'weighed',
  weigh_date: 'weighed',
  bred: 'bred_by',
  breeder: 'bred_by',
  arrived_on: 'arrived',
  weight_lbs: 'weight_lb',
  weight_pounds: 'weight_lb',
  weight_ounces: 'weight_oz',
  weight_kgs: 'weight_kg',
  weight_kilograms: 'weight_kg',
  weight_grams: 'weight_g',
};

/** "Weight (lb)", "weight-lb", " Weight LB " → "weight_lb". */
export function normaliseHeader(raw: string): string {
  const simple = raw
    .trim()
    .toLowerCase()
    .replace(/[()[\]]/g, ' ')
    .trim()
    .replace(/[\s-]+/g, '_');
  return aliases[simple] ?? simple;
}

export interface HeaderMapping {
  /** Column index of each field found. */
  index: Partial<Record<ImportField, number>>;
  weightColumn: WeightColumn | null;
  /** Headers we do not know, as written; their cells are not read. */
  ignored: string[];
  /** The export's computed columns found in the file (read past). */
  computed: string[];
  missing: RequiredImportColumn[];
  /** Fields named by more than one column. */
  duplicated: string[];
  /** A weight column that does not say its unit, as written. */
  unitlessWeight: string | null;
  /** More than one weight column (only one unit may be used). */
  severalWeights: string[];
}

/** Reads the first line of the file: which column holds which field. */
export function mapImportHeader(header: readonly string[]): HeaderMapping {
  const known = new Set<string>([...requiredImportColumns, ...optionalImportColumns]);
  const computed = new Set<string>(computedExportColumns);
  const mapping: HeaderMapping = {
    index: {}, weightColumn: null, ignored: [], computed: [], missing: [], duplicated: [], unitlessWeight: null, severalWeights: [],
  };
  header.forEach((raw, column) => {
    const name = normaliseHeader(raw);
    if (name === '') return;
    if ((weightColumns as readonly string[]).includes(name)) {
      if (mapping.weightColumn) {
        mapping.severalWeights.push(raw.trim());
        return;
      }
      mapping.weightColumn = name as WeightColumn;
      mapping.index.weight = column;
      return;
    }
    if (name === 'weight' || name === 'live_weight') {
      mapping.unitlessWeight = raw.trim();
      return;
    }
    if (known.has(name)) {
      const field = name as ImportField;
      if (mapping.index[field] !== undefined) mapping.duplicated.push(name);
      else mapping.index[field] = column;
      return;
    }
    if (computed.has(name)) mapping.computed.push(name);
    else mapping.ignored.push(raw.trim());
  });
  if (mapping.severalWeights.length > 0 && mapping.weightColumn) mapping.severalWeights.unshift(mapping.weightColumn);
  mapping.missing = requiredImportColumns.filter((c) => mapping.index[c] === undefined);
  return mapping;
}

/**
 * What is wrong with the header as a whole, as one sentence that says which (the file is refused
 * before any row is read), or null when the rows can be checked.
 */
export function headerProblem(mapping: HeaderMapping, header: readonly string[]): string | null {
  if (mapping.missing.length > 0) {
    const found = header.map((h) => h.trim()).filter(Boolean);
    const saw = found.length > 0 ? ` The first line has: ${found.slice(0, 8).join(', ')}${found.length > 8 ? ', …' : ''}.` : '';
    return (
      `The file has no ${mapping.missing.length === 1 ? 'column' : 'columns'} for ${listOf(mapping.missing)}. ` +
      `Its first line must name the columns ${requiredImportColumns.join(',')}.${saw}`
    );
  }
  if (mapping.duplicated.length > 0) return `The ${listOf(mapping.duplicated)} column appears more than once; keep one of each.`;
  if (mapping.unitlessWeight) {
    return `The column "${mapping.unitlessWeight}" does not say its unit. Name it weight_lb, weight_oz, weight_kg or weight_g.`;
  }
  if (mapping.severalWeights.length > 0) return `Give weights in one column only (found ${listOf(mapping.severalWeights)}).`;
  return null;
}

function listOf(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * A cell safe to open in a spreadsheet: text that a spreadsheet would run as a formula (=, +, -, @,
 * tab, carriage return) gets a leading apostrophe (OWASP, CSV injection). The server's one CSV writer
 * applies it to every cell, so an export never picks columns to escape.
 */
export function spreadsheetSafe(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** The inverse of `spreadsheetSafe` for a cell read from a file we may have written. */
export function fromSpreadsheetSafe(value: string): string {
  return /^'[=+\-@\t\r]/.test(value) ? value.slice(1) : value;
}
