// GET /api/studios/:studioId/kits/instruments – the catalogued instruments a kit slot can hold (all libraries).
import { route } from "@/lib/server/route";
import { listInstrumentChoices } from "@/lib/server/kits/catalogue-for-audit";
import { studioParams } from "@/lib/validation/studio";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => ({ instruments: await listInstrumentChoices({ studioId: studio.id }) }));
