// The client's door reads what the server's door writes: answers made by lib/server/errors.ts toErrorBody (the
// route wrapper's one error shape) become ApiError with the same code, message and details; an upload's
// answer becomes the file's outcomes or the reason it failed. Our own API contract (DEVELOPERS.md), no
// published source.
import { afterEach, describe, expect, it, vi } from "vitest";
import { AppError, toErrorBody } from "@/lib/server/errors";
import { api, apiBytes, ApiError } from "./api";
import { readUploadAnswer } from "./uploads";

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } });

afterEach(() => vi.unstubAllGlobals());

describe("api()", () => {
  it("sends JSON with POST when there is a body, and reads the answer", async () => {
    const fetch = vi.fn(async () => json(201, { id: "s1" }));
    vi.stubGlobal("fetch", fetch);
    await expect(api<{ id: string }>("/api/studios", { body: { name: "Pier" } })).resolves.toEqual({ id: "s1" });
    expect(fetch).toHaveBeenCalledWith("/api/studios", { method: "POST", headers: { "content-type": "application/json" }, body: '{"name":"Pier"}', credentials: "same-origin" });
  });

  it("answers undefined for 204 (a DELETE)", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => new Response(null, { status: 204 })));
    await expect(api("/api/studios/s/kits/k", { method: "DELETE" })).resolves.toBeUndefined();
  });

  it("turns the server's error body into ApiError with its status, code, message and details", async () => {
    const { status, body } = toErrorBody(new AppError("invalid-input", "Nothing in the batch was accepted.", { files: [{ name: "a.txt", status: "refused" }] }));
    vi.stubGlobal("fetch", vi.fn(async () => json(status, body)));
    const e = await api("/api/x").catch((x: unknown) => x);
    expect(e).toBeInstanceOf(ApiError);
    expect(e).toMatchObject({ status: 422, code: "invalid-input", message: "Nothing in the batch was accepted.", details: { files: [{ name: "a.txt", status: "refused" }] } });
  });

  it("says what the status was when the answer is not our JSON", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => new Response("<html>Bad gateway</html>", { status: 502 })));
    await expect(api("/api/x")).rejects.toMatchObject({ status: 502, code: "error", message: "The server answered 502." });
  });

  it("apiBytes gives the stored bytes, or says which file the server refused", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => new Response(new Uint8Array([82, 73, 70, 70]), { status: 200 })));
    expect([...new Uint8Array(await apiBytes("/a", "the sample audio"))]).toEqual([82, 73, 70, 70]);
    vi.stubGlobal("fetch", vi.fn(async () => json(404, toErrorBody(new AppError("not-found", "The sample was not found.")).body)));
    await expect(apiBytes("/a", "the sample audio")).rejects.toMatchObject({ status: 404, message: "the server answered 404 for the sample audio" });
  });
});

describe("readUploadAnswer()", () => {
  const files = [{ name: "Kick/kick_v1.wav", status: "queued", sampleId: "x" }, { name: "notes.wav", status: "refused", code: "not-wav", reason: "not a WAV file" }];

  it("201: the outcome of each file", () => {
    expect(readUploadAnswer(201, { files, counts: { queued: 1, duplicate: 0, refused: 1 } })).toEqual({ ok: true, files });
  });

  it("422 and 413 with outcomes (nothing accepted): the outcome of each file, as the server wrote them", () => {
    for (const [code, status] of [["invalid-input", 422], ["too-large", 413]] as const) {
      const out = toErrorBody(new AppError(code, "Nothing was accepted.", { files }));
      expect(out.status).toBe(status);
      expect(readUploadAnswer(out.status, out.body)).toEqual({ ok: true, files });
    }
  });

  it("any other refusal, or no answer: the reason the file did not get through", () => {
    expect(readUploadAnswer(503, toErrorBody(new AppError("unavailable", "The server is busy right now; try again in a moment.")).body)).toEqual({ ok: false, reason: "The server is busy right now; try again in a moment." });
    expect(readUploadAnswer(502, null)).toEqual({ ok: false, reason: "the server answered 502" });
    expect(readUploadAnswer(0, null)).toEqual({ ok: false, reason: "the connection failed" });
  });
});
