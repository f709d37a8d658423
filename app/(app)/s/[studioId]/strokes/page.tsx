import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { strokeListAnswer } from "@/lib/server/strokes";
import { can } from "@/lib/permissions";
import { StrokeManager } from "@/components/strokes/stroke-manager";

export const metadata: Metadata = { title: "Strokes" };

export default async function StrokesPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const initial = await strokeListAnswer(studio.id);
  return <StrokeManager studioId={studio.id} initial={initial} canWrite={can(studio.role, "studio:write")} />;
}
