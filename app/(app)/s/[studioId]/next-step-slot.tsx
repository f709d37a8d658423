// The studio's next step on a studio page (computed on the server, lib/server/next-step.ts). Once every step is
// done it shows only where asked (`always`: the overview), so the other pages keep their room.
import { studioNextStep } from "@/lib/server/next-step";
import { NextStepCard } from "@/components/next-step";
import type { Role } from "@/lib/permissions";

export async function NextStepSlot({ studio, always = false }: { studio: { id: string; role: Role }; always?: boolean }) {
  const step = await studioNextStep(studio.id, studio.role);
  if (step.key === "done" && !always) return null;
  return <NextStepCard studioId={studio.id} step={step} />;
}
