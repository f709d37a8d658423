// GET /api/openapi.json – the HTTP API as an OpenAPI 3.1 document, generated from the routes' zod schemas
// (lib/server/openapi.ts). Public: it describes the API, never data.
import { route } from "@/lib/server/route";
import { env } from "@/lib/server/env";
import { openApiDocument } from "@/lib/server/openapi";

let cached: ReturnType<typeof openApiDocument> | null = null;

export const GET = route({ access: { kind: "public" } }, async () => (cached ??= openApiDocument(env().KW_APP_URL)));
