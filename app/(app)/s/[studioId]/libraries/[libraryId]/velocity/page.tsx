import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { libraryVelocityResponse } from "@/lib/server/catalogue/velocity-response";
import { VelocityResponse } from "@/components/library/velocity-response";

export const metadata: Metadata = { title: "Velocity response" };

export default async function VelocityPage({ params }: { params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  const view = await libraryVelocityResponse({ studioId: studio.id, libraryId });
  return <VelocityResponse studioId={studio.id} libraryId={libraryId} initial={view} />;
}
