import "server-only";
// Which of a list of SHA-256 digests a library already holds: asked by `kitwright upload` before it sends
// anything, so files the library has (the upload would answer "duplicate") are not sent again.
import { db } from "../db";
import { assertLibrary } from "./libraries";
import type { HashLookupAnswer } from "@/lib/api-types/tokens";

export async function knownHashes({ studioId, libraryId, sha256 }: { studioId: string; libraryId: string; sha256: string[] }): Promise<HashLookupAnswer> {
  await assertLibrary({ studioId, libraryId });
  const wanted = [...new Set(sha256)];
  // (library_id, sha256) is the samples table's unique key: one index range per digest
  const rows = await db()("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("sha256", wanted).select("sha256", "id", "rel_path");
  return { known: rows.map((r) => ({ sha256: r.sha256, sampleId: r.id, path: r.rel_path })) };
}
