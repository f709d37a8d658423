import "server-only";
// Sample storage behind one interface. Local disk under the data folder by default.
import fs from "node:fs/promises";
import path from "node:path";
import { env } from "./env";

export interface Storage {
  kind: string;
  check(): Promise<void>;
}

class LocalStorage implements Storage {
  readonly kind = "local";
  constructor(private readonly root: string) {}
  async check(): Promise<void> {
    await fs.mkdir(this.root, { recursive: true });
    const probe = path.join(this.root, `.probe-${process.pid}`);
    await fs.writeFile(probe, "ok");
    await fs.unlink(probe);
  }
}

let cached: Storage | undefined;
export function storage(): Storage {
  if (!cached) cached = new LocalStorage(path.resolve(env().KW_STORAGE_DIR));
  return cached;
}
