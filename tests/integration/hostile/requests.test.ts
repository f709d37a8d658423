// Hostile requests at the door (lib/server/route.ts and the upload's multipart parsing): text that is not
// Unicode, content types that only look like JSON, multipart bodies without a boundary. Pass: a 4xx naming the
// problem, nothing written, never a 5xx (hostileCall fails the test on any 5xx).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/lib/server/db";
import { newId } from "@/lib/server/ids";
import { closeQueues } from "@/lib/server/jobs";
import { createLibrary } from "@/lib/server/catalogue/libraries";
import * as studios from "@/app/api/studios/route";
import * as studioOne from "@/app/api/studios/[studioId]/route";
import * as libs from "@/app/api/studios/[studioId]/libraries/route";
import * as kits from "@/app/api/studios/[studioId]/kits/route";
import * as layouts from "@/app/api/studios/[studioId]/layouts/route";
import * as instrument from "@/app/api/studios/[studioId]/libraries/[libraryId]/instruments/[instrumentId]/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import { GET as me } from "@/app/api/me/route";
import { call, makeStudioWithRoles, uniq, type CallOptions } from "../helpers";
import type { WrappedHandler } from "@/lib/server/route";

/** Every call of the hostile suites goes through here: a 5xx fails the test whatever else it checks. */
export async function hostileCall(handler: WrappedHandler, o: CallOptions) {
  const r = await call(handler, o);
  expect(r.status, `5xx from ${o.method ?? "POST"} ${o.path ?? ""}: ${JSON.stringify(r.json)}`).toBeLessThan(500);
  return r;
}

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
let instrumentId: string;

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
  libraryId = (await createLibrary({ studioId: ctx.studio.id, actorId: ctx.users.owner.id, name: uniq("Hostile requests") })).id;
  instrumentId = newId();
  await db()("instruments").insert({ id: instrumentId, studio_id: ctx.studio.id, library_id: libraryId, key: uniq("snare"), name: "Snare", family: "snare" });
});

afterAll(async () => {
  await closeQueues();
  await closeDb();
});

const activityCount = async () => Number((await db()("activity").where({ studio_id: ctx.studio.id }).count({ n: "*" }).first())!.n);

describe("text that is not Unicode (a lone UTF-16 surrogate, RFC 8259 section 8.2; invalid UTF-8, RFC 3629)", () => {
  // JSON.stringify writes a lone surrogate as the escape \ud800 (ECMA-262 well-formed JSON.stringify)
  const lone = (name: string) => JSON.stringify({ name: `${name} \ud800 end` });
  const cases: { what: string; handler: WrappedHandler; method?: string; params: () => Record<string, string>; body: (n: string) => string }[] = [
    { what: "studio (create)", handler: studios.POST, params: () => ({}), body: lone },
    { what: "studio (rename)", handler: studioOne.PATCH, method: "PATCH", params: () => ({ studioId: ctx.studio.id }), body: lone },
    { what: "library", handler: libs.POST, params: () => ({ studioId: ctx.studio.id }), body: lone },
    { what: "kit", handler: kits.POST, params: () => ({ studioId: ctx.studio.id }), body: lone },
    { what: "layout", handler: layouts.POST, params: () => ({ studioId: ctx.studio.id }), body: (n) => JSON.stringify({ name: `${n} \udfff`, template: "gm-percussion" }) },
    { what: "instrument (rename)", handler: instrument.PATCH, method: "PATCH", params: () => ({ studioId: ctx.studio.id, libraryId, instrumentId }), body: lone },
  ];
  for (const c of cases) {
    it(`a ${c.what} name with a lone surrogate: 422 naming the field, nothing written`, async () => {
      const before = await activityCount();
      const name = uniq("lone");
      const r = await hostileCall(c.handler, { method: c.method ?? "POST", user: ctx.users.owner, params: c.params(), rawBody: c.body(name), headers: { "content-type": "application/json" } });
      expect(r.status).toBe(422);
      expect(r.json.error.code).toBe("invalid-input");
      expect(r.json.error.message).toMatch(/^body\.name: .*not valid Unicode/);
      expect(await activityCount()).toBe(before);
      for (const t of ["studios", "libraries", "kits", "layouts", "instruments"]) expect(await db()(t).where("name", "like", `${name}%`).first(), t).toBeUndefined();
    });
  }

  it("a lone surrogate in a nested field or a key is found too", async () => {
    const r = await hostileCall(kits.POST, { user: ctx.users.owner, params: { studioId: ctx.studio.id }, rawBody: '{"name":"ok","slots":[{"id":"a","name":"x\\udc00","family":"kick","instrumentId":null}]}', headers: { "content-type": "application/json" } });
    expect(r.status).toBe(422);
    expect(r.json.error.message).toMatch(/^body\.slots\.0\.name: .*not valid Unicode/);
    const k = await hostileCall(studios.POST, { user: ctx.users.owner, rawBody: '{"name":"ok","\\ud800":1}', headers: { "content-type": "application/json" } });
    expect(k.status).toBe(422);
    expect(k.json.error.message).toMatch(/not valid Unicode/);
  });

  it("bytes that are not UTF-8 (a surrogate encoded as bytes ED A0 80, an overlong form) are refused, not replaced", async () => {
    const name = uniq("bytes");
    for (const bad of [[0xed, 0xa0, 0x80], [0xc0, 0xaf], [0xff]]) {
      const body = Buffer.concat([Buffer.from(`{"name":"${name} `), Buffer.from(bad), Buffer.from('"}')]);
      const r = await hostileCall(studios.POST, { user: ctx.users.owner, rawBody: new Uint8Array(body), headers: { "content-type": "application/json" } });
      expect(r.status).toBe(422);
      expect(r.json.error.message).toMatch(/not valid UTF-8/);
    }
    expect(await db()("studios").where("name", "like", `${name}%`).first()).toBeUndefined();
  });

  it("well-formed text outside the BMP (a surrogate pair) is kept as sent", async () => {
    const name = `${uniq("pair")} 🥁 𝄞`;
    const r = await hostileCall(studios.POST, { user: ctx.users.owner, body: { name } });
    expect(r.status).toBe(201);
    expect((await db()("studios").where({ id: r.json.id }).first("name")).name).toBe(name);
  });
});

describe("the JSON media type (RFC 9110 section 8.3.1: type and subtype case-insensitive, parameters after ';')", () => {
  const send = (type: string, name: string) => hostileCall(studios.POST, { user: ctx.users.owner, rawBody: JSON.stringify({ name }), headers: { "content-type": type } });
  it("accepts application/json in any case and with parameters", async () => {
    for (const type of ["application/json", "APPLICATION/JSON", "Application/Json; charset=UTF-8", "application/json ; charset=utf-8", "application/json;charset=\"utf-8\""]) {
      const r = await send(type, uniq("typed"));
      expect(r.status, type).toBe(201);
    }
  });
  it("refuses other types that merely contain the words", async () => {
    for (const type of ["text/plain; charset=application/json", "application/jsonx", "application/json-patch", "text/application/json", "application/x-www-form-urlencoded; a=application/json", "application", ""]) {
      const name = uniq("untyped");
      const r = await send(type, name);
      expect(r.status, type).toBe(422);
      expect(r.json.error.message, type).toMatch(/Send the body as JSON/);
      expect(await db()("studios").where({ name }).first(), type).toBeUndefined();
    }
  });
});

describe("multipart uploads without a usable boundary (RFC 2046 section 5.1.1: boundary is a required parameter, 1 to 70 characters)", () => {
  const body = new TextEncoder().encode('--x\r\nContent-Disposition: form-data; name="file"; filename="a.wav"\r\n\r\nRIFF....WAVE\r\n--x--\r\n');
  const types = [
    "multipart/form-data",
    "multipart/form-data;",
    "multipart/form-data; boundary=",
    'multipart/form-data; boundary=""',
    "multipart/form-data; charset=utf-8",
    "multipart/form-data; boundary",
    "multipart/form-data;boundary= ",
  ];
  for (const type of types) {
    it(`Content-Type "${type}": 422 naming the boundary, nothing stored`, async () => {
      const before = await activityCount();
      const r = await hostileCall(uploadRoute.POST, { method: "POST", user: ctx.users.editor, params: { studioId: ctx.studio.id, libraryId }, rawBody: body, headers: { "content-type": type } });
      expect(r.status).toBe(422);
      expect(r.json.error.message).toMatch(/boundary/);
      expect(await db()("samples").where({ library_id: libraryId }).first()).toBeUndefined();
      expect(await activityCount()).toBe(before);
    });
  }
  it("the media type's case does not matter (Multipart/Form-Data with a boundary is read)", async () => {
    const notWav = new TextEncoder().encode('--x\r\nContent-Disposition: form-data; name="file"; filename="a.wav"\r\n\r\nnot a wave file\r\n--x--\r\n');
    const r = await hostileCall(uploadRoute.POST, { method: "POST", user: ctx.users.editor, params: { studioId: ctx.studio.id, libraryId }, rawBody: notWav, headers: { "content-type": "Multipart/Form-Data; boundary=x" } });
    // read, and its one file refused (not a WAV): an all-refused batch is a 422 with the outcomes
    expect(r.status).toBe(422);
    expect(r.json.error.details.files[0]).toMatchObject({ name: "a.wav", status: "refused", code: "not-wav" });
  });
});

describe("forwarding headers from clients", () => {
  it("a cross-site write naming its own site in X-Forwarded-Host is refused (no proxy is trusted by default)", async () => {
    const name = uniq("forged-host");
    const r = await hostileCall(studios.POST, { user: ctx.users.owner, body: { name }, crossOrigin: true, headers: { "x-forwarded-host": "evil.example" } });
    expect(r.status).toBe(403);
    expect(r.json.error.message).toBe("Requests from another site are refused.");
    expect(await db()("studios").where({ name }).first()).toBeUndefined();
  });
});

describe("caching of signed-in answers (RFC 9111 section 5.2.2: private, no-store)", () => {
  it("successful JSON answers for a signed-in user say Cache-Control: private, no-store", async () => {
    const a = await hostileCall(me, { method: "GET", user: ctx.users.viewer });
    expect(a.status).toBe(200);
    expect(a.res.headers.get("cache-control")).toBe("private, no-store");
    const b = await hostileCall(studioOne.GET, { method: "GET", user: ctx.users.viewer, params: { studioId: ctx.studio.id } });
    expect(b.res.headers.get("cache-control")).toBe("private, no-store");
    const c = await hostileCall(studios.POST, { user: ctx.users.owner, body: { name: uniq("cached") } });
    expect(c.status).toBe(201);
    expect(c.res.headers.get("cache-control")).toBe("private, no-store");
  });
});
