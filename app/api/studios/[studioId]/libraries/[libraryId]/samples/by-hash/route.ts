// POST /api/studios/:studioId/libraries/:libraryId/samples/by-hash – which of these SHA-256 digests the library
// already holds (a read with a long list, hence POST; answers 200). `kitwright upload` asks it before sending.
import { NextResponse } from "next/server";
import { route } from "@/lib/server/route";
import { knownHashes } from "@/lib/server/catalogue/sample-hashes";
import { libraryParams } from "@/lib/validation/library";
import { hashLookupSchema } from "@/lib/validation/token";

export const POST = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams, body: hashLookupSchema }, async ({ studio, params, body }) =>
  NextResponse.json(await knownHashes({ studioId: studio.id, libraryId: params.libraryId, sha256: body.sha256 })),
);
