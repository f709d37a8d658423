import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { listInstruments } from "@/lib/server/catalogue/instruments";
import { can } from "@/lib/permissions";
import { InstrumentsList } from "@/components/library/instruments";

export const metadata: Metadata = { title: "Instruments" };

export default async function InstrumentsPage({ params }: { params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  const instruments = await listInstruments({ studioId: studio.id, libraryId });
  return <InstrumentsList studioId={studio.id} libraryId={libraryId} instruments={instruments} canWrite={can(studio.role, "studio:write")} />;
}
