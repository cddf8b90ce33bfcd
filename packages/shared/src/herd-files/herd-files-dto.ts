import type { ImportField, WeightColumn } from './csv-columns';

/** What confirming a row does: add a new animal, change fields of one in the herd, or nothing. */
export type ImportAction = 'create' | 'update' | 'unchanged';

/** A problem with a row: `column` names the cell (null for the row as a whole). */
export interface ImportIssueDto {
  column: ImportField | null;
  message: string;
}

export interface ImportFieldChangeDto {
  field: ImportField;
  from: string;
  to: string;
}

/** One checked row of a staged file, as written in it, with what confirming would do. */
export interface HerdImportRowDto {
  /** The line of the file the row starts on (the header is line 1). */
  line: number;
  action: ImportAction;
  /** The animal the row is about: the herd's own, or the id the new animal will get. */
  animalId: string;
  tattoo: string;
  name: string;
  sex: string;
  breed: string;
  born: string;
  sire: string;
  dam: string;
  colour: string;
  registration: string;
  /** The weight as written, with the unit of the file's weight column. */
  weight: string;
  changes: ImportFieldChangeDto[];
  errors: ImportIssueDto[];
  warnings: ImportIssueDto[];
}

export interface HerdImportSummaryDto {
  rows: number;
  create: number;
  update: number;
  unchanged: number;
  /** Rows with at least one error (nothing can be imported while there are any). */
  withErrors: number;
  withWarnings: number;
  /** Rows with an error or a warning (or both). */
  withProblems: number;
  weighIns: number;
  columns: { mapped: ImportField[]; ignored: string[]; computed: string[] };
  weightColumn: WeightColumn | null;
}

export const herdImportStatuses = ['ready', 'confirmed'] as const;
export type HerdImportStatus = (typeof herdImportStatuses)[number];

export const importRowFilters = ['all', 'problems', 'errors', 'create', 'update', 'unchanged'] as const;
export type ImportRowFilter = (typeof importRowFilters)[number];

export interface HerdImportResultDto {
  created: number;
  updated: number;
  weighIns: number;
  /** Animals of the co-op whose COI or breed make-up changed with the import. */
  figuresChanged: number;
  confirmedAt: string;
  confirmedBy: { id: string; name: string } | null;
}

/** A staged spreadsheet: its preview, a page of its rows, and once confirmed what it did. */
export interface HerdImportDto {
  id: string;
  fileName: string;
  byteSize: number;
  /** SHA-256 of the file as uploaded, hex. */
  checksum: string;
  /** Whether the file began with a UTF-8 byte-order mark (read the same either way). */
  hadByteOrderMark: boolean;
  status: HerdImportStatus;
  createdAt: string;
  summary: HerdImportSummaryDto;
  /** True when no row has an error and it has not been imported yet. */
  canConfirm: boolean;
  rows: { items: HerdImportRowDto[]; total: number; page: number; pageSize: number; show: ImportRowFilter };
  result: HerdImportResultDto | null;
}

/** Progress while a large file is checked (one line of the streamed answer). */
export interface HerdImportProgressDto {
  phase: 'reading' | 'checking' | 'saving';
  done: number;
  total: number;
}

/** The streamed answer to a staging request sent with `Accept: application/x-ndjson`, one JSON object a line. */
export type HerdImportStreamLine =
  | ({ type: 'progress' } & HerdImportProgressDto)
  | { type: 'result'; status: number; body: HerdImportDto }
  | { type: 'error'; status: number; body: { error: { code: string; message: string; details?: Record<string, string[]> } } };

export type PhotoSubject = 'animal' | 'farm' | 'chore' | 'chat';

export interface PhotoDto {
  id: string;
  subject: PhotoSubject;
  animalId: string | null;
  /** The farm that took it; null for a chat photo shared by someone without a farm. */
  farmId: string | null;
  caption: string;
  width: number;
  height: number;
  contentType: string;
  byteSize: number;
  /** Served only through the API, which checks the viewer may see it. */
  url: string;
  thumbnailUrl: string;
  uploadedAt: string;
  uploadedBy: { id: string; name: string } | null;
}

export interface PhotoLimitsDto {
  /** Photos an animal may have. */
  maxPhotos: number;
  /** Bytes one photo may have. */
  maxBytes: number;
  /** Photos one upload may carry. */
  perUpload: number;
  types: string[];
}

export interface AnimalPhotosDto {
  photos: PhotoDto[];
  canChange: boolean;
  limits: PhotoLimitsDto;
}

export interface FarmPhotoDto {
  photo: PhotoDto | null;
  canChange: boolean;
  limits: PhotoLimitsDto;
}
