// GET /api/health – status of the database, Redis and storage (503 when any is down).
import { NextResponse } from "next/server";
import { route } from "@/lib/server/route";
import { checkHealth } from "@/lib/server/health";

export const dynamic = "force-dynamic";

export const GET = route({ access: { kind: "public" } }, async () => {
  const h = await checkHealth();
  return NextResponse.json(h, { status: h.ok ? 200 : 503, headers: { "cache-control": "no-store" } });
});
