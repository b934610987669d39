/**
 * Reads a whole file in the browser chunk by chunk (papaparse streams a Blob through FileReader),
 * pausing after each chunk so the page can paint the progress bar: a 100 000-row file stays responsive.
 */
import Papa from "papaparse";
import { SweepRowReader, type SweepColumnMapping, type SweepCsvLayout, type SweepCsvResult } from "@/lib/import/sweep-csv";

const CHUNK_BYTES = 256 * 1024;

export function streamSweepCsv(file: Blob, layout: SweepCsvLayout, mapping: SweepColumnMapping, onProgress: (fraction: number) => void): Promise<SweepCsvResult> {
  const reader = new SweepRowReader(layout, mapping);
  return new Promise((resolve, reject) => {
    Papa.parse<string[]>(file as File, {
      delimiter: layout.delimiter,
      skipEmptyLines: false,
      chunkSize: CHUNK_BYTES,
      chunk: (results, parser) => {
        if (!reader.accept(results.data)) {
          parser.abort();
          return;
        }
        onProgress(Math.min(1, results.meta.cursor / Math.max(1, file.size)));
        parser.pause();
        setTimeout(() => parser.resume(), 0);
      },
      complete: () => {
        onProgress(1);
        resolve(reader.finish());
      },
      error: (error) => reject(error),
    });
  });
}
