import { defineStore } from 'pinia';
import Papa from 'papaparse';
import { computed, ref, shallowRef } from 'vue';
import {
  IMPORT_LAYOUTS,
  IMPORT_MAX_BYTES,
  type ImportKind,
  type ImportLayout,
  type ImportRowError,
} from '@shared/schemas/imports';
import { ApiError } from '@/api/http';
import * as importsApi from '@/api/imports';
import { formatFileSize } from '@/format';

/** Data rows shown before the import; enough to spot a shifted column or a wrong file. */
export const PREVIEW_ROWS = 10;

/** One data row as the file holds it: its line number (header = 1) and trimmed cells. */
export interface PreviewRow {
  line: number;
  cells: string[];
}

/** What the browser read of a chosen file before anything is sent. */
export interface CsvPreview {
  fileName: string;
  size: number;
  /** Trimmed cells of the first non-blank line; empty when the file holds nothing. */
  header: string[];
  /** The first data rows, at most PREVIEW_ROWS. */
  rows: PreviewRow[];
  /** Every non-blank data row of the file. */
  rowCount: number;
}

export type HeaderProblemKind = 'unknown' | 'missing' | 'duplicate';

/** A header cell that the server would refuse, found before upload. */
export interface HeaderProblem {
  column: string;
  kind: HeaderProblemKind;
}

/**
 * Why a chosen file cannot be imported before reading it (wrong type, too large), or null.
 * The server checks the same limit; refusing here saves sending 5 MB for nothing.
 */
export function checkCsvFile(file: { name: string; size: number }): string | null {
  if (!file.name.toLowerCase().endsWith('.csv')) {
    return `“${file.name}” is not a .csv file. Save the sheet as “CSV UTF-8 (comma delimited)” and choose that file.`;
  }
  if (file.size > IMPORT_MAX_BYTES) {
    return `“${file.name}” is ${formatFileSize(file.size)}; an import file may be at most ${formatFileSize(IMPORT_MAX_BYTES)}. Split it into smaller files and import each.`;
  }
  return null;
}

/**
 * Reads CSV text the way the server does (byte-order mark dropped, blank lines skipped, cells
 * trimmed, quoted cells may span lines) so the row numbers shown match the server's report.
 */
export function readCsvPreview(text: string, limit = PREVIEW_ROWS): Pick<CsvPreview, 'header' | 'rows' | 'rowCount'> {
  const clean = text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  const read = { header: null as string[] | null, rows: [] as PreviewRow[], rowCount: 0 };
  let line = 1;
  let consumed = 0;
  Papa.parse<string[]>(clean, {
    delimiter: ',',
    newline: '\n',
    step: (result) => {
      const start = line;
      const cells = result.data.map((cell) => cell.trim());
      for (
        let index = clean.indexOf('\n', consumed);
        index !== -1 && index < result.meta.cursor;
        index = clean.indexOf('\n', index + 1)
      ) {
        line += 1;
      }
      consumed = result.meta.cursor;
      if (cells.every((cell) => cell === '')) return;
      if (read.header === null) {
        read.header = cells;
        return;
      }
      read.rowCount += 1;
      if (read.rows.length < limit) read.rows.push({ line: start, cells });
    },
  });
  return { header: read.header ?? [], rows: read.rows, rowCount: read.rowCount };
}

/** Header cells the layout does not know, required columns it lacks, and repeated names. */
export function findHeaderProblems(header: readonly string[], layout: ImportLayout): HeaderProblem[] {
  const problems: HeaderProblem[] = [];
  const seen = new Set<string>();
  for (const name of header) {
    if (name === '') continue;
    if (!layout.columns.includes(name)) problems.push({ column: name, kind: 'unknown' });
    else if (seen.has(name)) problems.push({ column: name, kind: 'duplicate' });
    seen.add(name);
  }
  for (const name of layout.required) {
    if (!seen.has(name)) problems.push({ column: name, kind: 'missing' });
  }
  return problems;
}

/** Optional columns of the layout that the header leaves out (existing values are kept). */
export function findLeftOutColumns(header: readonly string[], layout: ImportLayout): string[] {
  return layout.columns.filter((name) => !layout.required.includes(name) && !header.includes(name));
}

/** How the last import of the chosen file ended. */
export type ImportOutcome =
  | { status: 'imported'; kind: ImportKind; imported: number; fileName: string }
  | { status: 'rejected'; kind: ImportKind; message: string; problems: ImportRowError[] }
  | { status: 'failed'; kind: ImportKind; error: ApiError };

export const useImportsStore = defineStore('imports', () => {
  const kind = ref<ImportKind | null>(null);
  // shallowRef: a reactive proxy around a File breaks its native methods (text(), slice()).
  const file = shallowRef<File | null>(null);
  const preview = shallowRef<CsvPreview | null>(null);
  const reading = ref(false);
  const readError = ref<string | null>(null);
  const uploading = ref(false);
  /** Share of the file sent, 0 to 1; 1 while the server checks the rows. */
  const progress = ref(0);
  const outcome = shallowRef<ImportOutcome | null>(null);
  const downloading = ref(false);
  let pendingUpload: AbortController | null = null;

  const layout = computed<ImportLayout | null>(() => (kind.value ? IMPORT_LAYOUTS[kind.value] : null));
  const rowCount = computed(() => preview.value?.rowCount ?? 0);
  const problems = computed(() => (outcome.value?.status === 'rejected' ? outcome.value.problems : []));

  /** Picks what the next file holds; an outcome for another kind no longer applies. */
  function chooseKind(next: ImportKind): void {
    if (kind.value === next) return;
    kind.value = next;
    outcome.value = null;
  }

  /** Keeps the file and reads its preview; a file that cannot be read is kept out with `readError`. */
  async function chooseFile(next: File): Promise<void> {
    reading.value = true;
    readError.value = null;
    outcome.value = null;
    try {
      const text = await next.text();
      preview.value = { fileName: next.name, size: next.size, ...readCsvPreview(text) };
      file.value = next;
    } catch {
      readError.value = `“${next.name}” could not be read. Choose it again; if it is open in another program, save and close it first.`;
    } finally {
      reading.value = false;
    }
  }

  /** Forgets the chosen file, its preview and the outcome of its last import. */
  function clearFile(): void {
    file.value = null;
    preview.value = null;
    readError.value = null;
    outcome.value = null;
  }

  /**
   * Sends the chosen file. On success the file is let go (it is in); on any refusal it stays
   * chosen so the user can fix the data it points at and send it again.
   */
  async function runImport(): Promise<ImportOutcome | null> {
    const chosenKind = kind.value;
    const chosenFile = file.value;
    if (!chosenKind || !chosenFile || uploading.value) return null;
    uploading.value = true;
    progress.value = 0;
    outcome.value = null;
    pendingUpload = new AbortController();
    try {
      const result = await importsApi.importCsv(chosenKind, chosenFile, {
        onProgress: (fraction) => {
          progress.value = fraction;
        },
        signal: pendingUpload.signal,
      });
      outcome.value = { status: 'imported', kind: chosenKind, imported: result.imported, fileName: chosenFile.name };
      file.value = null;
      preview.value = null;
    } catch (cause) {
      if (cause instanceof DOMException && cause.name === 'AbortError') return null;
      if (!(cause instanceof ApiError)) throw cause;
      const rowProblems = importsApi.importProblems(cause);
      outcome.value =
        cause.status === 422
          ? { status: 'rejected', kind: chosenKind, message: cause.message, problems: rowProblems }
          : { status: 'failed', kind: chosenKind, error: cause };
    } finally {
      uploading.value = false;
      pendingUpload = null;
    }
    return outcome.value;
  }

  /** Stops an upload in flight; nothing is written when the server never got the whole file. */
  function cancelImport(): void {
    pendingUpload?.abort();
  }

  /** The template CSV of a kind; rethrows the ApiError for the view to report. */
  async function downloadTemplate(templateKind: ImportKind): Promise<Blob> {
    downloading.value = true;
    try {
      return await importsApi.downloadImportTemplate(templateKind);
    } finally {
      downloading.value = false;
    }
  }

  return {
    kind,
    file,
    preview,
    reading,
    readError,
    uploading,
    progress,
    outcome,
    downloading,
    layout,
    rowCount,
    problems,
    chooseKind,
    chooseFile,
    clearFile,
    runImport,
    cancelImport,
    downloadTemplate,
  };
});
