// The velocity curves in words: the library settings' choice, and what a member who may not change it reads.
// (Not a client module, so server pages read the words too.)
import type { VelocityCurveName } from "@/lib/validation/library";

export const VELOCITY_CURVE_WORDS: Record<VelocityCurveName, string> = {
  dls: "Square law (MMA DLS Level 1): the default",
  dannenberg: "Dannenberg (ICMC 2006), over each group's measured range",
};
