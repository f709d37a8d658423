// GET/PUT/DELETE /api/studios/:studioId/layouts/:layoutId/share – the layout's share link: read it (members),
// publish it or change its description or link (owners, editors), revoke it (the link answers 404 at once).
import { route } from "@/lib/server/route";
import { getShare, publishLayout, unpublishLayout } from "@/lib/server/kits/shares";
import { layoutParams, publishLayoutSchema } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: layoutParams }, async ({ studio, params }) => ({
  share: await getShare({ studioId: studio.id, layoutId: params.layoutId }),
}));

export const PUT = route({ access: { kind: "studio", permission: "studio:write" }, params: layoutParams, body: publishLayoutSchema }, async ({ studio, user, params, body }) => ({
  share: await publishLayout({ studioId: studio.id, actorId: user.id, layoutId: params.layoutId, description: body.description, newLink: body.newLink }),
}));

export const DELETE = route({ access: { kind: "studio", permission: "studio:write" }, params: layoutParams }, async ({ studio, user, params }) => {
  await unpublishLayout({ studioId: studio.id, actorId: user.id, layoutId: params.layoutId });
  return null;
});
