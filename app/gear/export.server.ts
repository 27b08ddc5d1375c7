// The register as CSV, streamed: a batch of items is read, written and let go before the next is read, so an export
// of 50,000 items holds one batch in memory, and other requests are served between batches.
import { CSV_HEADERS } from "~/gear/csv-columns";
import { CSV_BOM, csvLines, exportRow } from "~/gear/csv";
import { dueState } from "~/gear/due";
import { readGearExportBatch } from "~/models/gear-item-reads.server";

/** Items read and written per step. */
export const EXPORT_BATCH = 250;

/** The organisation's register as CSV bytes, in item id order: the same text `toCsv` gives for the whole list. */
export function gearRegisterCsv(organisationId: number, today: string, batch = EXPORT_BATCH) {
  const encoder = new TextEncoder();
  let after: string | null = null;
  let started = false;
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        if (!started) {
          started = true;
          controller.enqueue(encoder.encode(CSV_BOM + csvLines([CSV_HEADERS])));
          return;
        }
        const items = await readGearExportBatch(organisationId, after, batch);
        if (items.length > 0) {
          after = items[items.length - 1]!.itemCode;
          controller.enqueue(
            encoder.encode(
              csvLines(
                items.map((item) =>
                  exportRow({ ...item, homeSiteId: null, dueState: dueState(item.nextDueOn, today) }),
                ),
              ),
            ),
          );
        }
        if (items.length < batch) controller.close();
      },
    },
    { highWaterMark: 1 },
  );
}
