/**
 * A CSV file streamed as its rows are read: a web ReadableStream (what a route handler returns) that asks for the
 * next page only when the reader has taken the previous one (`pull`), so the server holds one page of rows and its
 * text, whatever the file's size. A client that goes away cancels the stream, which closes the page reader.
 */
const encoder = new TextEncoder();

/**
 * `pages` are written with `page(rows, first)` (lib/export/logbook-csv.ts `sessionCsvPage`); with no rows at all the
 * file is `page([], true)`, the header alone.
 */
export function csvStream<Row>(pages: AsyncIterator<Row[]>, page: (rows: Row[], first: boolean) => string): ReadableStream<Uint8Array> {
  let first = true;
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        const next = await pages.next();
        if (next.done) {
          if (first) controller.enqueue(encoder.encode(page([], true)));
          controller.close();
          return;
        }
        controller.enqueue(encoder.encode(page(next.value, first)));
        first = false;
      },
      async cancel() {
        await pages.return?.(undefined);
      },
    },
    // One page in the queue at a time: pull is called again only once the reader has taken it.
    { highWaterMark: 1 },
  );
}
