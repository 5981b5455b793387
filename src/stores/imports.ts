import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import {
  IMPORT_LAYOUTS,
  IMPORT_MAX_BYTES,
  type ImportKind,
  type ImportLayout,
  type ImportRowError,
} from '@shared/schemas/imports';
import { normaliseCsvText, readCsvRows } from '@shared/domain/csv';
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

/** The header, the first rows and the row count of CSV text, read by the same rule as the server's import. */
export function readCsvPreview(text: string, limit = PREVIEW_ROWS): Pick<CsvPreview, 'header' | 'rows' | 'rowCount'> {
  let header: string[] | null = null;
  const rows: PreviewRow[] = [];
  let rowCount = 0;
  readCsvRows(normaliseCsvText(text), ({ line, cells }) => {
    if (header === null) {
      header = cells;
      return;
    }
    rowCount += 1;
    if (rows.length < limit) rows.push({ line, cells });
  });
  return { header: header ?? [], rows, rowCount };
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
