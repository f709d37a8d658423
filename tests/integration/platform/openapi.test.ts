// GET /api/openapi.json: a valid OpenAPI 3.1 document (checked with @seriousme/openapi-schema-validator against
// the OpenAPI Initiative's published JSON Schema for 3.1), whose every operation is a real route handler parsing
// with the very zod schemas the document was made from, and which holds every call `kitwright upload` makes.
import fs from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { Validator } from "@seriousme/openapi-schema-validator";
import { closeDb } from "@/lib/server/db";
import { API_OPERATIONS } from "@/lib/server/openapi";
import type { RouteMeta } from "@/lib/server/route";
import { UPLOAD_API } from "@/cli/upload-api";
import { call } from "../helpers";
import * as openapiRoute from "@/app/api/openapi.json/route";

afterAll(() => closeDb());

type Doc = { openapi: string; paths: Record<string, Record<string, any>>; components: { schemas: Record<string, any>; securitySchemes: Record<string, any> } };

async function fetchDoc(): Promise<Doc> {
  const r = await call(openapiRoute.GET, { path: "/api/openapi.json" });
  expect(r.status).toBe(200);
  expect(r.res.headers.get("content-type")).toMatch(/^application\/json/);
  return r.json as Doc;
}

const routeFile = (p: string) => path.resolve("app", p.slice(1).replace(/\{(\w+)\}/g, "[$1]"), "route.ts");

describe("the OpenAPI document", () => {
  it("is valid OpenAPI 3.1, public, with both ways to authenticate", async () => {
    const doc = await fetchDoc();
    expect(doc.openapi).toBe("3.1.0");
    const v = new Validator();
    const res = await v.validate(doc as never);
    expect(res.errors ?? []).toEqual([]);
    expect(res.valid).toBe(true);
    expect(v.version).toBe("3.1");
    expect(doc.components.securitySchemes.apiToken).toMatchObject({ type: "http", scheme: "bearer" });
    expect(doc.components.securitySchemes.session).toMatchObject({ type: "apiKey", in: "cookie" });
  });

  it("covers tokens, libraries, samples and uploads, kits, layouts and audits", async () => {
    const doc = await fetchDoc();
    const tags = new Set(Object.values(doc.paths).flatMap((ops) => Object.values(ops).flatMap((o: any) => o.tags)));
    expect([...tags].sort()).toEqual(["Audits", "Kits", "Layouts", "Libraries", "Samples", "Strokes", "Tokens"]);
    expect(Object.keys(doc.paths).length).toBeGreaterThanOrEqual(15);
  });

  it("documents each operation with the route handler's own schemas and access rule", async () => {
    const problems: string[] = [];
    for (const op of API_OPERATIONS) {
      const file = routeFile(op.path);
      if (!fs.existsSync(file)) {
        problems.push(`${op.path}: no ${path.relative(process.cwd(), file)}`);
        continue;
      }
      const mod = (await import(/* @vite-ignore */ file)) as Record<string, { meta?: RouteMeta } | undefined>;
      const h = mod[op.method.toUpperCase()];
      if (!h?.meta) {
        problems.push(`${op.method.toUpperCase()} ${op.path}: no such handler`);
        continue;
      }
      const m = h.meta;
      for (const k of ["params", "query", "body"] as const) if (m.schemas[k] !== op[k]) problems.push(`${op.method} ${op.path}: ${k} is not the route's schema`);
      if (op.multipart && m.schemas.body) problems.push(`${op.method} ${op.path}: multipart, yet the route parses a JSON body`);
      const kind = { public: "public", session: "user", studio: "studio" }[op.access];
      if (m.access.kind !== kind) problems.push(`${op.method} ${op.path}: documented as ${op.access}, the route is ${m.access.kind}`);
      if (!!m.tokens !== !!op.tokens) problems.push(`${op.method} ${op.path}: tokens ${!!op.tokens} documented, ${!!m.tokens} in the route`);
    }
    expect(problems).toEqual([]);
  });

  it("holds every call of `kitwright upload`, with the method and request it sends", async () => {
    const doc = await fetchDoc();
    for (const c of Object.values(UPLOAD_API)) {
      const op = doc.paths[c.path]?.[c.method.toLowerCase()];
      expect(op, `${c.method} ${c.path}`).toBeDefined();
      // a token opens each of them
      expect(op.security).toContainEqual({ apiToken: [] });
      const params = (op.parameters ?? []).filter((p: any) => p.in === "path").map((p: any) => p.name);
      expect(params).toEqual([...c.path.matchAll(/\{(\w+)\}/g)].map((x) => x[1]));
    }
    const byHash = doc.paths[UPLOAD_API.byHash.path]!.post;
    expect(byHash.requestBody.content["application/json"].schema).toEqual({
      type: "object",
      properties: { sha256: { type: "array", items: { type: "string", pattern: "^[0-9a-fA-F]{64}$" }, minItems: 1, maxItems: 1000 } },
      required: ["sha256"],
      additionalProperties: false,
    });
    expect(byHash.responses["200"].content["application/json"].schema).toEqual({ $ref: "#/components/schemas/KnownHashes" });
    const upload = doc.paths[UPLOAD_API.upload.path]!.post;
    expect(Object.keys(upload.requestBody.content)).toEqual(["multipart/form-data"]);
    expect(upload.requestBody.content["multipart/form-data"].schema.properties.file.items).toEqual({ type: "string", format: "binary" });
    expect(doc.components.schemas.UploadFileResult.properties.status.enum).toEqual(["queued", "duplicate", "refused"]);
    expect(Object.keys(upload.responses).sort()).toEqual(["201", "401", "403", "404", "413", "422"]);
    expect(doc.paths[UPLOAD_API.whoami.path]!.get.responses["200"].content["application/json"].schema).toEqual({ $ref: "#/components/schemas/Whoami" });
    // the token routes take a session only
    expect(doc.paths["/api/me/tokens"]!.post.security).toEqual([{ session: [] }]);
    expect(doc.paths["/api/me/tokens"]!.post.requestBody.content["application/json"].schema.properties.role.enum).toEqual(["owner", "editor", "viewer"]);
  });
});
