// GET /api/shared/:token[?download=1] – a shared layout, for anyone with the link (no account): the layout alone
// with its description, or (download) our kitwright.layout/v1 file. Does not count as a view (the page does).
import { route } from "@/lib/server/route";
import { attachment } from "@/lib/server/kits/download";
import { viewSharedLayout } from "@/lib/server/kits/shares";
import { layoutToFile } from "@/lib/audit/schema";
import { sharedParams } from "@/lib/validation/kit";
import { z } from "zod";

export const GET = route({ access: { kind: "public" }, params: sharedParams, query: z.strictObject({ download: z.literal("1").optional() }) }, async ({ params, query }) => {
  const view = await viewSharedLayout(params.token, { count: false });
  if (!query.download) return view;
  return attachment(JSON.stringify(layoutToFile(view.layout), null, 2) + "\n", "application/json", `${view.name}.layout.json`);
});
