// A race the scale test (tests/scale) met with 1,000 files: an upload whose body broke off used to be taken back
// whole (its recorded rows deleted), while a second upload of the same file, received meanwhile (a client that
// gave up on the first request and sent the batch again), had been answered "duplicate" of the first one's row:
// the client was told the library holds the file, and it did not. A broken-off upload now keeps the files it
// received whole (upload/finish.ts refuseBrokenUpload), so the promise holds.
import { afterAll, beforeAll, expect, it } from "vitest";
import { NextRequest } from "next/server";
import { call, makeStudioWithRoles, sessionCookie, uniq } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { closeQueues } from "@/lib/server/jobs";
import { hitWav, multipart } from "./helpers";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
  libraryId = (await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Race") }, user: ctx.users.editor })).json.id;
});
afterAll(async () => {
  await db()("studios").whereIn("id", [ctx.studio.id, ctx.otherStudio.id]).delete();
  await closeQueues();
  await closeDb();
});

async function uploadStream(stream: ReadableStream<Uint8Array>, type: string) {
  const cookie = await sessionCookie(ctx.users.editor);
  const base = env().KW_APP_URL;
  const req = new NextRequest(new URL("/api/x", base), { method: "POST", headers: { host: new URL(base).host, origin: new URL(base).origin, cookie: cookie!, "content-type": type }, body: stream, duplex: "half" } as unknown as ConstructorParameters<typeof NextRequest>[1]);
  return uploadRoute.POST(req, { params: Promise.resolve({ studioId: ctx.studio.id, libraryId }) });
}

it("a file answered 'duplicate' of a row recorded by an upload that then breaks off stays in the library", async () => {
  const first = { name: "race/first.wav", data: hitWav(70, { freq: 310 }) };
  const { body, type } = await multipart([first, { name: "race/second.wav", data: hitWav(71, { seconds: 1 }) }]);
  const cutAt = body.length - 30_000; // inside the second file
  const row = () => db()("samples").where({ library_id: libraryId, rel_path: first.name }).first("id");
  let breakOff: (e: Error) => void = () => undefined;
  const stream = new ReadableStream<Uint8Array>({
    start(c) {
      c.enqueue(body.subarray(0, cutAt));
      breakOff = (e) => c.error(e);
    },
  });
  const a = uploadStream(stream, type);
  // the first request has recorded first.wav and waits for the rest of its body
  for (let i = 0; i < 200 && !(await row()); i++) await new Promise((r) => setTimeout(r, 50));
  expect(await row()).toBeTruthy();
  // the client sends the file again: the library has it
  const again = await multipart([first]);
  const b = await call(uploadRoute.POST, { method: "POST", params: { studioId: ctx.studio.id, libraryId }, rawBody: again.body, headers: { "content-type": again.type }, user: ctx.users.editor });
  expect(b.json.files[0]).toMatchObject({ status: "duplicate", reason: `same content as ${first.name}` });
  // the first request breaks off: refused, the file it received whole kept
  breakOff(new Error("aborted"));
  const refused = await a;
  expect(refused.status).toBe(422);
  expect((await refused.json()).error.message).toMatch(/The 1 file received whole before the break was kept/);
  // what the second answer promised: the library holds the file
  expect(await row()).toBeTruthy();
});
