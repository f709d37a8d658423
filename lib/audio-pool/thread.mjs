// Bootstrap of a measuring thread: registers the TypeScript loader in this thread, then loads the entry.
import { register } from "tsx/esm/api";

register();
await import("./measure-thread.ts");
