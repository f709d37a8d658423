import "server-only";
// The HTTP API in OpenAPI 3.1, generated from the zod schemas the routes parse with (lib/validation) by
// @asteasolutions/zod-to-openapi; served at GET /api/openapi.json. Request schemas are the routes' own objects
// (tests/integration/platform/openapi.test.ts checks each operation's params, query and body against the route
// handler's `meta.schemas`, so the document cannot drift from what the server parses). Answers are written here
// as zod schemas checked against their lib/api-types type at compile time (`satisfies`); where an answer is a
// large document of its own (a kit, a layout, an audit result) it is described in words and by its type's name.
import { OpenAPIRegistry, OpenApiGeneratorV31 } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import { ROLES } from "@/lib/permissions";
import { createLibrarySchema, deleteLibrarySchema, libraryParams, sampleParams, samplesQuery, SAMPLE_STATES, updateLibrarySchema, VELOCITY_CURVES, confirmSchema, relabelSchema } from "@/lib/validation/library";
import { auditListQuery, auditParams, createKitSchema, createLayoutSchema, kitDocSchema, kitParams, layoutParams, runAuditSchema, updateKitSchema, updateLayoutSchema } from "@/lib/validation/kit";
import { studioParams } from "@/lib/validation/studio";
import { createTokenSchema, hashLookupSchema, tokenParams } from "@/lib/validation/token";
import { deleteStrokeQuery, strokeInputSchema, strokeListQuery, strokeParams, updateStrokeSchema } from "@/lib/validation/strokes";
import type { ApiTokenList, ApiTokenSummary, CreatedToken, HashLookupAnswer, Whoami } from "@/lib/api-types/tokens";
import type { UploadFileResult, UploadSummary } from "@/lib/api-types/uploads";
import type { CreatedLibrary, LibraryList, LibrarySummary } from "@/lib/api-types/libraries";
import type { SamplesPage } from "@/lib/api-types/samples";
import type { KitList, KitSummary } from "@/lib/api-types/kits";
import type { LayoutList, LayoutSummary } from "@/lib/api-types/layouts";
import type { AuditList, AuditSummaryRow } from "@/lib/api-types/audits";
import type { ErrorBody } from "@/lib/api-types/errors";

// ---- answers ----------------------------------------------------------------------------------------------

const iso = z.string().meta({ format: "date-time" });
const role = z.enum(ROLES);

const errorBody = z
  .object({ error: z.object({ code: z.string(), message: z.string().meta({ description: "What went wrong, in words for a person." }), details: z.unknown().optional() }) })
  .meta({ id: "Error" }) satisfies z.ZodType<ErrorBody>;

const tokenSummary = z
  .object({
    id: z.string(),
    name: z.string(),
    studioId: z.string(),
    studioName: z.string(),
    role,
    effectiveRole: role.nullable().meta({ description: "The lower of `role` and the creator's role in the studio now; null once they left it." }),
    hint: z.string().meta({ description: "The first characters of the secret." }),
    createdAt: iso,
    expiresAt: iso.nullable(),
    lastUsedAt: iso.nullable(),
    revokedAt: iso.nullable(),
  })
  .meta({ id: "ApiToken" }) satisfies z.ZodType<ApiTokenSummary>;
const tokenList = z.object({ tokens: z.array(tokenSummary) }) satisfies z.ZodType<ApiTokenList>;
const createdToken = z.object({ token: tokenSummary, secret: z.string().meta({ description: "The token itself, shown this once: only its SHA-256 is kept." }) }) satisfies z.ZodType<CreatedToken>;
const whoami = z
  .object({
    user: z.object({ id: z.string(), name: z.string(), email: z.string() }),
    via: z.enum(["session", "token"]),
    token: z.object({ id: z.string(), name: z.string(), studioId: z.string(), studioName: z.string(), role: role.nullable() }).nullable(),
  })
  .meta({ id: "Whoami" }) satisfies z.ZodType<Whoami>;
const hashAnswer = z.object({ known: z.array(z.object({ sha256: z.string(), sampleId: z.string(), path: z.string() })) }).meta({ id: "KnownHashes" }) satisfies z.ZodType<HashLookupAnswer>;

const uploadFile = z
  .object({
    name: z.string().meta({ description: "The file's path as sent (or inside its zip pack)." }),
    status: z.enum(["queued", "duplicate", "refused"]),
    reason: z.string().optional().meta({ description: "Why a file was refused, in words." }),
    code: z.string().optional().meta({ description: "Stable refusal code: not-wav, rf64, too-large, bad-path, path-too-long, bad-name, too-many, zip-*, empty, interrupted, error." }),
    sampleId: z.string().optional(),
  })
  .meta({ id: "UploadFileResult" }) satisfies z.ZodType<UploadFileResult>;
const uploadSummary = z
  .object({ files: z.array(uploadFile), counts: z.object({ queued: z.number().int(), duplicate: z.number().int(), refused: z.number().int() }) })
  .meta({ id: "UploadSummary" }) satisfies z.ZodType<UploadSummary>;

const stateCounts = z.object({ queued: z.number().int(), measuring: z.number().int(), measured: z.number().int(), catalogued: z.number().int(), rejected: z.number().int(), total: z.number().int() });
const librarySummary = z
  .object({
    id: z.string(),
    name: z.string(),
    description: z.string().nullable(),
    createdAt: iso,
    updatedAt: iso,
    counts: stateCounts,
    instruments: z.number().int(),
    healthComputedAt: iso.nullable(),
    velocityCurve: z.enum(VELOCITY_CURVES),
  })
  .meta({ id: "Library" }) satisfies z.ZodType<LibrarySummary>;
const libraryList = z.object({ libraries: z.array(librarySummary) }) satisfies z.ZodType<LibraryList>;
const createdLibrary = z.object({ id: z.string(), name: z.string() }) satisfies z.ZodType<CreatedLibrary>;

const nullableNumber = z.number().nullable();
const nullableString = z.string().nullable();
const sampleRow = z
  .object({
    id: z.string(), path: z.string(), fileName: z.string(), state: z.enum(SAMPLE_STATES), rejectCode: nullableString, rejectReason: nullableString,
    family: nullableString, familySource: nullableString, articulation: nullableString, articulationSource: nullableString, confidence: nullableNumber,
    mic: nullableString, instrumentKey: nullableString, instrumentName: nullableString, layerIndex: nullableNumber, layerCount: nullableNumber,
    roundRobin: nullableNumber, velocityLow: nullableNumber, velocityHigh: nullableNumber, strikeLufs: nullableNumber, truePeakDbtp: nullableNumber,
    durationSec: nullableNumber, sampleRate: nullableNumber, bits: nullableNumber, channels: nullableNumber, centroidHz: nullableNumber,
    decaySec: nullableNumber, conflict: nullableString, confirmed: z.boolean(), sizeBytes: z.number().int(),
  })
  .meta({ id: "Sample" });
const samplesPage = z.object({ rows: z.array(sampleRow), total: z.number().int(), page: z.number().int(), pageSize: z.number().int(), search: z.enum(["words", "contains"]).optional() }) satisfies z.ZodType<SamplesPage>;

const kitSummary = z.object({ id: z.string(), name: z.string(), slots: z.number().int(), filled: z.number().int(), updatedAt: iso }).meta({ id: "KitSummary" }) satisfies z.ZodType<KitSummary>;
const kitList = z.object({ kits: z.array(kitSummary) }) satisfies z.ZodType<KitList>;
const kitAnswer = z.object({ kit: z.object({ id: z.string(), name: z.string(), kit: kitDocSchema, createdAt: iso, updatedAt: iso }) }).meta({ id: "KitAnswer" });
const layoutSummary = z
  .object({ id: z.string(), name: z.string(), kind: z.enum(["grid", "zones"]), rows: nullableNumber, cols: nullableNumber, pads: z.number().int(), pedal: z.boolean(), updatedAt: iso })
  .meta({ id: "LayoutSummary" }) satisfies z.ZodType<LayoutSummary>;
const layoutList = z.object({ layouts: z.array(layoutSummary) }) satisfies z.ZodType<LayoutList>;
const layoutAnswer = z.object({ layout: z.object({ id: z.string(), name: z.string(), layout: z.record(z.string(), z.unknown()).meta({ description: "The layout document (lib/audit/SCHEMA.md)." }), createdAt: iso, updatedAt: iso }) }).meta({ id: "LayoutAnswer" });
const auditSummary = z
  .object({ id: z.string(), layoutId: z.string(), kitId: nullableString, layoutName: z.string(), kitName: z.string(), score: z.number(), silentPads: z.number().int(), standInPads: z.number().int(), conflicts: z.number().int(), createdAt: iso, createdBy: nullableString })
  .meta({ id: "AuditSummary" }) satisfies z.ZodType<AuditSummaryRow>;
const auditList = z.object({ audits: z.array(auditSummary) }) satisfies z.ZodType<AuditList>;
const auditAnswer = z.object({ audit: auditSummary.extend({ result: z.record(z.string(), z.unknown()).meta({ description: "The audit's findings (AuditResult, lib/audit/SCHEMA.md)." }) }) }).meta({ id: "AuditAnswer" });

// ---- operations ---------------------------------------------------------------------------------------------

type Method = "get" | "post" | "patch" | "delete";
type Access = "public" | "session" | "studio";

/** One documented operation: the route's own request schemas, its answers, who may call it. */
export interface ApiOperation {
  method: Method;
  /** OpenAPI path template ({studioId}); the route file is app/api/<same path with [studioId]>/route.ts. */
  path: string;
  summary: string;
  tag: string;
  /** session: signed-in people only; studio: a member of the studio (session or personal API token). */
  access: Access;
  /** A session route that also takes a personal API token. */
  tokens?: boolean;
  params?: z.ZodObject;
  query?: z.ZodObject;
  body?: z.ZodType;
  multipart?: z.ZodObject;
  ok: { status: 200 | 201 | 204; description: string; schema?: z.ZodType };
}

const multipartUpload = z.object({
  file: z.array(z.string().meta({ format: "binary" })).meta({
    description: "One part per file (name=\"file\"), its file name the path inside the library (folders carry names); .wav, .wave, .bwf or a .zip pack.",
  }),
});

export const API_OPERATIONS: ApiOperation[] = [
  // who am I, tokens
  { method: "get", path: "/api/whoami", tag: "Tokens", summary: "Who the request acts for (a session, or a personal API token with its studio and role)", access: "session", tokens: true, ok: { status: 200, description: "The person, and the token if one was used.", schema: whoami } },
  { method: "get", path: "/api/me/tokens", tag: "Tokens", summary: "My personal API tokens, with their last use (never a secret)", access: "session", ok: { status: 200, description: "The tokens, newest first.", schema: tokenList } },
  { method: "post", path: "/api/me/tokens", tag: "Tokens", summary: "Make a personal API token for one studio, with a role at most mine there", access: "session", body: createTokenSchema, ok: { status: 201, description: "The token and its secret (shown once).", schema: createdToken } },
  { method: "delete", path: "/api/me/tokens/{tokenId}", tag: "Tokens", summary: "Revoke one of my tokens (requests with it answer 401 from now on)", access: "session", params: tokenParams, ok: { status: 204, description: "Revoked." } },
  // libraries
  { method: "get", path: "/api/studios/{studioId}/libraries", tag: "Libraries", summary: "The studio's libraries with their counts", access: "studio", params: studioParams, ok: { status: 200, description: "The libraries.", schema: libraryList } },
  { method: "post", path: "/api/studios/{studioId}/libraries", tag: "Libraries", summary: "Create a library (editors, owners)", access: "studio", params: studioParams, body: createLibrarySchema, ok: { status: 201, description: "The new library's id.", schema: createdLibrary } },
  { method: "get", path: "/api/studios/{studioId}/libraries/{libraryId}", tag: "Libraries", summary: "One library with its counts", access: "studio", params: libraryParams, ok: { status: 200, description: "The library.", schema: librarySummary } },
  { method: "patch", path: "/api/studios/{studioId}/libraries/{libraryId}", tag: "Libraries", summary: "Rename or describe a library, or choose its velocity curve (editors, owners)", access: "studio", params: libraryParams, body: updateLibrarySchema, ok: { status: 200, description: "The library.", schema: librarySummary } },
  { method: "delete", path: "/api/studios/{studioId}/libraries/{libraryId}", tag: "Libraries", summary: "Delete a library with its files (owners; its name typed again)", access: "studio", params: libraryParams, body: deleteLibrarySchema, ok: { status: 204, description: "Deleted." } },
  // uploads and samples
  {
    method: "post", path: "/api/studios/{studioId}/libraries/{libraryId}/uploads", tag: "Samples",
    summary: "Upload WAV files and .zip packs (multipart/form-data, streamed); every file gets its own outcome. A batch in which nothing was accepted answers 422 (413 when a file was too large) with the outcomes in error.details.files",
    access: "studio", params: libraryParams, multipart: multipartUpload, ok: { status: 201, description: "At least one file was accepted.", schema: uploadSummary },
  },
  { method: "post", path: "/api/studios/{studioId}/libraries/{libraryId}/samples/by-hash", tag: "Samples", summary: "Which of these SHA-256 digests the library already holds (asked before uploading)", access: "studio", params: libraryParams, body: hashLookupSchema, ok: { status: 200, description: "The digests the library holds.", schema: hashAnswer } },
  { method: "get", path: "/api/studios/{studioId}/libraries/{libraryId}/samples", tag: "Samples", summary: "One page of the library's samples, sorted, searched and filtered", access: "studio", params: libraryParams, query: samplesQuery, ok: { status: 200, description: "The page.", schema: samplesPage } },
  { method: "get", path: "/api/studios/{studioId}/libraries/{libraryId}/samples/{sampleId}", tag: "Samples", summary: "One sample with its peaks, the reasons for its labels and key measures", access: "studio", params: sampleParams, ok: { status: 200, description: "The sample (a Sample with peaks, reasons, measurement and sound: the family the sound alone suggests, its source and the families it weighed with their fit)." } },
  { method: "post", path: "/api/studios/{studioId}/libraries/{libraryId}/samples/relabel", tag: "Samples", summary: "Set labels of samples (they become the members' confirmed labels)", access: "studio", params: libraryParams, body: relabelSchema, ok: { status: 201, description: "How many samples changed." } },
  { method: "post", path: "/api/studios/{studioId}/libraries/{libraryId}/samples/confirm", tag: "Samples", summary: "Confirm the current labels of samples as they are", access: "studio", params: libraryParams, body: confirmSchema, ok: { status: 201, description: "How many samples were confirmed." } },
  // kits
  { method: "get", path: "/api/studios/{studioId}/kits", tag: "Kits", summary: "The studio's kits", access: "studio", params: studioParams, ok: { status: 200, description: "The kits.", schema: kitList } },
  { method: "post", path: "/api/studios/{studioId}/kits", tag: "Kits", summary: "Create a kit: empty, with slots, or filled for a layout template", access: "studio", params: studioParams, body: createKitSchema, ok: { status: 201, description: "The kit.", schema: kitAnswer } },
  { method: "get", path: "/api/studios/{studioId}/kits/{kitId}", tag: "Kits", summary: "One kit", access: "studio", params: kitParams, ok: { status: 200, description: "The kit.", schema: kitAnswer } },
  { method: "patch", path: "/api/studios/{studioId}/kits/{kitId}", tag: "Kits", summary: "Rename a kit or save its slots", access: "studio", params: kitParams, body: updateKitSchema, ok: { status: 200, description: "The kit.", schema: kitAnswer } },
  { method: "delete", path: "/api/studios/{studioId}/kits/{kitId}", tag: "Kits", summary: "Delete a kit", access: "studio", params: kitParams, ok: { status: 204, description: "Deleted." } },
  // layouts
  { method: "get", path: "/api/studios/{studioId}/layouts", tag: "Layouts", summary: "The studio's pad layouts", access: "studio", params: studioParams, ok: { status: 200, description: "The layouts.", schema: layoutList } },
  { method: "post", path: "/api/studios/{studioId}/layouts", tag: "Layouts", summary: "Create a layout: from a template, a blank grid or trigger zones", access: "studio", params: studioParams, body: createLayoutSchema, ok: { status: 201, description: "The layout.", schema: layoutAnswer } },
  { method: "get", path: "/api/studios/{studioId}/layouts/{layoutId}", tag: "Layouts", summary: "One layout", access: "studio", params: layoutParams, ok: { status: 200, description: "The layout.", schema: layoutAnswer } },
  { method: "patch", path: "/api/studios/{studioId}/layouts/{layoutId}", tag: "Layouts", summary: "Rename a layout or save it whole", access: "studio", params: layoutParams, body: updateLayoutSchema, ok: { status: 200, description: "The layout.", schema: layoutAnswer } },
  { method: "delete", path: "/api/studios/{studioId}/layouts/{layoutId}", tag: "Layouts", summary: "Delete a layout", access: "studio", params: layoutParams, ok: { status: 204, description: "Deleted." } },
  // audits
  { method: "get", path: "/api/studios/{studioId}/audits", tag: "Audits", summary: "The studio's audits, newest first (of one layout with ?layoutId=)", access: "studio", params: studioParams, query: auditListQuery, ok: { status: 200, description: "The audits.", schema: auditList } },
  { method: "post", path: "/api/studios/{studioId}/audits", tag: "Audits", summary: "Audit a layout against a kit and the studio's catalogue now, and keep the result", access: "studio", params: studioParams, body: runAuditSchema, ok: { status: 201, description: "The audit.", schema: auditAnswer } },
  { method: "get", path: "/api/studios/{studioId}/audits/{auditId}", tag: "Audits", summary: "One audit with its findings", access: "studio", params: auditParams, ok: { status: 200, description: "The audit.", schema: auditAnswer } },
  // strokes
  { method: "get", path: "/api/studios/{studioId}/strokes", tag: "Strokes", summary: "The built-in strokes per family and the studio's own (?download=1: the studio's list as a kitwright.strokes/v1 file for the command line)", access: "studio", params: studioParams, query: strokeListQuery, ok: { status: 200, description: "The strokes." } },
  { method: "post", path: "/api/studios/{studioId}/strokes", tag: "Strokes", summary: "Add a stroke of the studio's own: its name, families, file-name words and nearest neighbours", access: "studio", params: studioParams, body: strokeInputSchema, ok: { status: 201, description: "The stroke." } },
  { method: "patch", path: "/api/studios/{studioId}/strokes/{strokeId}", tag: "Strokes", summary: "Change a stroke of the studio's own; renaming one in use answers 409 with its uses unless moveUses is true", access: "studio", params: strokeParams, body: updateStrokeSchema, ok: { status: 200, description: "The stroke." } },
  { method: "delete", path: "/api/studios/{studioId}/strokes/{strokeId}", tag: "Strokes", summary: "Remove a stroke of the studio's own; when in use, 409 with its uses unless ?moveTo= says where they go", access: "studio", params: strokeParams, query: deleteStrokeQuery, ok: { status: 200, description: "How many uses moved." } },
  { method: "get", path: "/api/studios/{studioId}/strokes/{strokeId}/uses", tag: "Strokes", summary: "What uses a stroke: samples per library, kits' stroke maps, layouts' pads and pedal zones, other strokes' edges", access: "studio", params: strokeParams, ok: { status: 200, description: "The uses." } },
];

const ERRORS: Record<number, string> = {
  401: "Not signed in, or the personal API token is unknown, revoked or expired.",
  403: "The role does not allow it, a token was sent where only a session may go, or the request came from another site.",
  404: "Not there, or in a studio the caller is not a member of.",
  413: "The body (or an uploaded file) is too large.",
  422: "The input was refused; the message names the field.",
};

/** The OpenAPI 3.1 document of API_OPERATIONS. */
export function openApiDocument(serverUrl?: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "apiToken", {
    type: "http",
    scheme: "bearer",
    description: "A personal API token (made on the account page): `Authorization: Bearer kwt_...`. It acts for its creator in its one studio, with its role capped by the creator's role now; every use is in the studio's activity log.",
  });
  registry.registerComponent("securitySchemes", "session", { type: "apiKey", in: "cookie", name: "next-auth.session-token", description: "The signed-in browser session. Writes must come from the app's own origin." });
  for (const op of API_OPERATIONS) {
    const errors = Object.fromEntries(
      [401, 403, 404, ...(op.body || op.multipart || op.query ? [422] : []), ...(op.multipart ? [413] : [])].map((s) => [String(s), { description: ERRORS[s]!, content: { "application/json": { schema: errorBody } } }]),
    );
    registry.registerPath({
      method: op.method,
      path: op.path,
      summary: op.summary,
      tags: [op.tag],
      security: op.access === "studio" || op.tokens ? [{ apiToken: [] }, { session: [] }] : [{ session: [] }],
      request: {
        ...(op.params ? { params: op.params } : {}),
        ...(op.query ? { query: op.query } : {}),
        ...(op.body ? { body: { required: true, content: { "application/json": { schema: op.body } } } } : {}),
        ...(op.multipart ? { body: { required: true, content: { "multipart/form-data": { schema: op.multipart } } } } : {}),
      },
      responses: {
        [String(op.ok.status)]: { description: op.ok.description, ...(op.ok.schema ? { content: { "application/json": { schema: op.ok.schema } } } : {}) },
        ...errors,
      },
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: "3.1.0",
    info: {
      title: "Kitwright API",
      version: "1",
      description: "Measure, sort and audit drum one-shot sample libraries and pad layouts. Errors answer { error: { code, message } }.",
    },
    ...(serverUrl ? { servers: [{ url: serverUrl }] } : {}),
  });
}
