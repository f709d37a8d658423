// The demo scenario's people (invented): printed by the demo command, used by the seed and the browser tests.
export const DEMO_STUDIO = "Harbour Lane Studio";

export const DEMO_ACCOUNTS = [
  { email: "marguerite@harbourlane.test", name: "Marguerite Oduya", role: "owner", password: "harbour-owner-1" },
  { email: "tobin@harbourlane.test", name: "Tobin Achterberg", role: "editor", password: "harbour-editor-1" },
  { email: "priya@harbourlane.test", name: "Priya Ramaswamy-Holt", role: "viewer", password: "harbour-viewer-1" },
] as const;
