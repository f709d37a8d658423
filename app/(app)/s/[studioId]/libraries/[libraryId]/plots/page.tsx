import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { libraryPlots } from "@/lib/server/catalogue/reports";
import { FeatureMap, LoudnessLadder } from "@/components/library/plots";

export const metadata: Metadata = { title: "Plots" };

export default async function PlotsPage({ params }: { params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  const data = await libraryPlots({ studioId: studio.id, libraryId });
  return (
    <div className="space-y-4">
      <LoudnessLadder groups={data.groups} />
      <FeatureMap points={data.points} />
    </div>
  );
}
