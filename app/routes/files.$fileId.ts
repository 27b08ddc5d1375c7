import { data } from "react-router";
import type { Route } from "./+types/files.$fileId";
import { getStoredFile } from "~/models/stored-file.server";
import { requireUser } from "~/utils/session.server";
import { contentDisposition, readStoredBytes } from "~/utils/uploads.server";

/** One stored file, to signed-in users of the organisation that owns it; anyone else gets a 404. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const fileId = Number(params.fileId);
  const file = Number.isInteger(fileId) ? await getStoredFile(user.organisationId, fileId) : null;
  if (!file) throw data({ message: "There is no such file in your organisation." }, { status: 404 });
  const bytes = await readStoredBytes(file);
  if (!bytes)
    throw data(
      { message: "The file's content is missing from storage; ask your admin to upload it again." },
      { status: 404 },
    );
  const isImage = file.contentType.startsWith("image/");
  return new Response(new Uint8Array(bytes) as Uint8Array<ArrayBuffer>, {
    headers: {
      "Content-Type": file.contentType,
      "Content-Length": String(bytes.byteLength),
      "Content-Disposition": contentDisposition(isImage ? "inline" : "attachment", file.originalName),
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "default-src 'none'; sandbox",
      "Cache-Control": "private, no-store",
    },
  });
}
