// POST /api/studios/:studioId/libraries/:libraryId/uploads – multipart upload of WAV files (file names carry
// their relative paths) and .zip packs, streamed to storage. Answers per file { name, status, reason?, sampleId? }.
// No `body` in the spec: the handler streams req.body itself.
import { route } from "@/lib/server/route";
import { receiveUpload } from "@/lib/server/catalogue/upload";
import { libraryParams } from "@/lib/validation/library";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: libraryParams }, async ({ studio, user, params, req }) =>
  receiveUpload({ studioId: studio.id, libraryId: params.libraryId, userId: user.id, req }),
);
