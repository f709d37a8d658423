// What `kitwright upload` remembers between runs, in a small JSON file in the user's cache folder, one per
// server + library + source: each file's SHA-256 (kept while its size and modification time, or for a zip
// entry its CRC-32 and size, stay the same, so a second run does not read everything again) and whether a run
// already delivered it. An interrupted run saves it before it exits; the next run asks the server which
// digests the library holds and sends only the rest.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";

export interface FileMemo {
  /** size:mtimeMs of a file, crc32:size of a zip entry: when it changes, the digest is read again. */
  stamp: string;
  sha256: string;
  /** A run delivered it (the library answered queued or duplicate). */
  delivered?: boolean;
}

interface StateFile {
  version: 1;
  server: string;
  libraryId: string;
  source: string;
  files: Record<string, FileMemo>;
}

/** $XDG_CACHE_HOME/kitwright/uploads (else ~/.cache/kitwright/uploads): where the state files live. */
export function stateDir(env: NodeJS.ProcessEnv = process.env): string {
  const base = env.XDG_CACHE_HOME && path.isAbsolute(env.XDG_CACHE_HOME) ? env.XDG_CACHE_HOME : path.join(os.homedir(), ".cache");
  return path.join(base, "kitwright", "uploads");
}

/** The state file of one server + library + source (the absolute path of the folder or zip). */
export function statePath(server: string, libraryId: string, source: string, env: NodeJS.ProcessEnv = process.env): string {
  const key = crypto.createHash("sha256").update(`${server}\n${libraryId}\n${source}`).digest("hex").slice(0, 24);
  return path.join(stateDir(env), `${libraryId}-${key}.json`);
}

export class UploadState {
  private data: StateFile;
  private dirty = false;

  private constructor(readonly file: string, data: StateFile) {
    this.data = data;
  }

  /** Reads the state of an earlier run, or starts an empty one (an unreadable file is started afresh). */
  static load(file: string, key: { server: string; libraryId: string; source: string }): UploadState {
    const empty: StateFile = { version: 1, ...key, files: {} };
    try {
      const d = JSON.parse(fs.readFileSync(file, "utf8")) as StateFile;
      const same = d.version === 1 && d.server === key.server && d.libraryId === key.libraryId && d.source === key.source && d.files && typeof d.files === "object";
      return new UploadState(file, same ? d : empty);
    } catch {
      return new UploadState(file, empty);
    }
  }

  /** The remembered digest of a file, while its stamp is unchanged. */
  digest(relPath: string, stamp: string): string | null {
    const m = this.data.files[relPath];
    return m && m.stamp === stamp ? m.sha256 : null;
  }

  wasDelivered(relPath: string): boolean {
    return this.data.files[relPath]?.delivered === true;
  }

  remember(relPath: string, memo: FileMemo): void {
    this.data.files[relPath] = memo;
    this.dirty = true;
  }

  markDelivered(relPath: string): void {
    const m = this.data.files[relPath];
    if (m && !m.delivered) {
      m.delivered = true;
      this.dirty = true;
    }
  }

  /** Writes the state if it changed (to a temporary file first, then renamed over: never half written). */
  save(): void {
    if (!this.dirty) return;
    fs.mkdirSync(path.dirname(this.file), { recursive: true });
    const tmp = `${this.file}.${process.pid}.tmp`;
    fs.writeFileSync(tmp, JSON.stringify(this.data));
    fs.renameSync(tmp, this.file);
    this.dirty = false;
  }
}
