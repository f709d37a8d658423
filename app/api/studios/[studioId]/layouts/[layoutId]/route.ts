// GET/PATCH/DELETE /api/studios/:studioId/layouts/:layoutId – read, rename or save the pads and pedal, delete.
import { route } from "@/lib/server/route";
import { deleteLayout, getLayout, updateLayout } from "@/lib/server/kits/layouts";
import { layoutParams, updateLayoutSchema } from "@/lib/validation/kit";
import type { Layout } from "@/lib/audit/types";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: layoutParams }, async ({ studio, params }) => ({ layout: await getLayout({ studioId: studio.id, layoutId: params.layoutId }) }));

export const PATCH = route({ access: { kind: "studio", permission: "studio:write" }, params: layoutParams, body: updateLayoutSchema }, async ({ studio, user, params, body }) => ({
  layout: await updateLayout({ studioId: studio.id, actorId: user.id, layoutId: params.layoutId, name: body.name, layout: body.layout as Omit<Layout, "id"> | undefined }),
}));

export const DELETE = route({ access: { kind: "studio", permission: "studio:write" }, params: layoutParams }, async ({ studio, user, params }) => {
  await deleteLayout({ studioId: studio.id, actorId: user.id, layoutId: params.layoutId });
  return null;
});
