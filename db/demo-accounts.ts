// The demo scenario's people (invented, from lib/synth/scenario.ts) with demo passwords: printed by the demo
// command, used by the seed and the browser tests.
import { DEMO_LIBRARY } from "../lib/synth/scenario";

export const DEMO_STUDIO = DEMO_LIBRARY.studio;

export const DEMO_ACCOUNTS = DEMO_LIBRARY.people.map((p) => ({
  email: p.email,
  name: p.name,
  role: p.role,
  password: `harbour-${p.role}-1`,
}));
