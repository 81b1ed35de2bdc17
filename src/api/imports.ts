import { importPreviewSchema, importResultSchema, type ImportPreview, type ImportResult, type ImportTarget } from '@shared/schemas/exchange';
import { errorFromAnswer, offlineError, cellarPath, unitsHeader, withQuery } from './http';

/** How much of a file the preview sends: enough for the headers and first rows. */
const PREVIEW_BYTES = 64 * 1024;

/** The import's choices as the server reads them from the query string. */
export interface ImportChoices {
  delimiter: string;
  dateFormat: string;
  temperatureUnit: string;
  gravityUnit: string;
  volumeUnit: string;
  decimalComma: boolean;
  /** field → header of the file */
  columns: Record<string, string>;
}

/** Sends a file (or its start) as the request body, streamed by the browser. */
async function sendCsv(url: string, body: Blob): Promise<unknown> {
  let res: Response;
  try {
    res = await fetch(url, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json', 'content-type': 'text/csv', ...unitsHeader() },
      body,
    });
  } catch {
    throw offlineError();
  }
  const raw = await res.json().catch(() => ({}));
  if (!res.ok) throw errorFromAnswer(res.status, raw);
  return raw;
}

/** The mapping screen's starting point, from the first 64 KB of the file. */
export async function previewImport(cellarId: string, target: ImportTarget, file: Blob): Promise<ImportPreview> {
  return importPreviewSchema.parse(await sendCsv(withQuery(cellarPath(cellarId, 'imports', 'preview'), { target }), file.slice(0, PREVIEW_BYTES)));
}

/** Imports the whole file, all or nothing; a refusal's `body.problems` lists each bad row and column. */
export async function runImport(cellarId: string, target: ImportTarget, file: Blob, choices: ImportChoices, batchId?: string): Promise<ImportResult> {
  const query = { ...choices, decimalComma: String(choices.decimalComma), columns: JSON.stringify(choices.columns), batchId };
  return importResultSchema.parse(await sendCsv(withQuery(cellarPath(cellarId, 'imports', target), query), file));
}
