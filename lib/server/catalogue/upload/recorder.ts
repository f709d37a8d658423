import "server-only";
// Batch recording of stored files: sample rows and their path words, many files per transaction, in upload
// order; a batch the database refuses is retried file by file (a deadlock with another upload into the same
// library is tried again); each recorded batch queues its measure jobs at once.
import path from "node:path";
import { db } from "../../db";
import { AppError } from "../../errors";
import { storage } from "../../storage";
import { enqueueMeasure } from "../queue";
import { insertSamplesWithWords } from "../words";
import { ERROR_REASON, type UploadFileResult } from "./outcome";

/** A stored file waiting to be recorded. */
export interface Stored { sampleId: string; key: string; relPath: string; sha256: string; bytes: number; result: UploadFileResult }

/**
 * Records stored files in upload order (so the first of two equal files is the one kept), in batches: one
 * duplicate lookup and one transaction (sample rows and their path words) for every file that is ready, rather
 * than a lookup and a commit per file. A file takes a ticket when it starts; the batch ends at the first ticket
 * not yet ready. A batch the database refuses as a whole (a file recorded meanwhile by another upload, the
 * library deleted) is recorded again file by file, so each file gets its own outcome.
 */
export class Recorder {
  private tickets = 0;
  private next = 0;
  private ready = new Map<number, Stored | null>();
  private busy = false;
  private waiting = new Map<number, () => void>();
  readonly recorded: Promise<void>[] = [];
  /** The files recorded `queued` (a broken request takes them back). */
  readonly queued: { sampleId: string }[] = [];
  private enqueueing: Promise<void> = Promise.resolve();
  private enqueueError: unknown = null;
  constructor(private readonly ctx: { studioId: string; libraryId: string; userId: string }) {}

  ticket(): number {
    return this.tickets++;
  }
  /** Hands a stored file over (or `null`: the ticket's file was refused); resolves once it is recorded. */
  submit(ticket: number, item: Stored | null): Promise<void> {
    const done = new Promise<void>((resolve) => this.waiting.set(ticket, resolve));
    this.ready.set(ticket, item);
    this.recorded.push(done);
    void this.pump();
    return done;
  }
  private async pump(): Promise<void> {
    if (this.busy) return;
    this.busy = true;
    try {
      while (this.ready.has(this.next)) {
        const batch: { t: number; item: Stored | null }[] = [];
        while (this.ready.has(this.next) && batch.length < 500) {
          batch.push({ t: this.next, item: this.ready.get(this.next)! });
          this.ready.delete(this.next++);
        }
        const items = batch.flatMap((b) => (b.item ? [b.item] : []));
        if (items.length) await this.record(items);
        for (const b of batch) this.waiting.get(b.t)?.();
        for (const b of batch) this.waiting.delete(b.t);
      }
    } finally {
      this.busy = false;
    }
  }
  private async record(items: Stored[]): Promise<void> {
    const { ctx } = this;
    try {
      const known = new Map<string, { id: string; rel_path: string }>();
      for (let i = 0; i < items.length; i += 1000) {
        const rows = await db()("samples").where({ library_id: ctx.libraryId }).whereIn("sha256", items.slice(i, i + 1000).map((x) => x.sha256)).select("id", "rel_path", "sha256");
        for (const r of rows) known.set(r.sha256, r);
      }
      const fresh: Stored[] = [];
      const dups: { item: Stored; of: { id: string; rel_path: string } }[] = [];
      for (const it of items) {
        const of = known.get(it.sha256);
        if (of) dups.push({ item: it, of });
        else {
          known.set(it.sha256, { id: it.sampleId, rel_path: it.relPath });
          fresh.push(it);
        }
      }
      await insertSamplesWithWords(db(), fresh.map((it) => this.row(it)));
      for (const it of fresh) this.markQueued(it);
      this.measure(fresh);
      await Promise.all(dups.map(({ item, of }) => this.duplicate(item, of)));
    } catch {
      // the batch as a whole was refused: file by file, each with its own outcome
      for (const it of items) await this.recordOne(it);
    }
  }
  private row(it: Stored) {
    const { ctx } = this;
    return {
      id: it.sampleId,
      studio_id: ctx.studioId,
      library_id: ctx.libraryId,
      rel_path: it.relPath,
      path_key: it.relPath.slice(0, 500),
      file_name: path.posix.basename(it.relPath).slice(0, 255),
      sha256: it.sha256,
      size_bytes: it.bytes,
      storage_key: it.key,
      state: "queued",
      uploaded_by: ctx.userId,
    };
  }
  /**
   * Queues the measuring of recorded files while the upload goes on (so the first files are measured before
   * the last arrive, and a large batch never builds all its jobs at once), in order, on a chain of its own: a
   * Redis that is away holds the chain (ioredis queues the commands until it returns), never the recording.
   */
  private measure(items: Stored[]) {
    const { studioId, libraryId } = this.ctx;
    const jobs = items.map((it) => ({ sampleId: it.sampleId, studioId, libraryId }));
    if (!jobs.length) return;
    this.enqueueing = this.enqueueing.then(() => enqueueMeasure(jobs)).catch((e) => void (this.enqueueError ??= e));
  }
  /** Resolves once every recorded file's job is queued; throws the first error met on the way. */
  async measuringQueued(): Promise<void> {
    await this.enqueueing;
    if (this.enqueueError) throw this.enqueueError;
  }
  private markQueued(it: Stored) {
    Object.assign(it.result, { status: "queued", sampleId: it.sampleId });
    this.queued.push({ sampleId: it.sampleId });
  }
  private async duplicate(it: Stored, of: { id?: string; rel_path?: string } | undefined) {
    await storage().delete(it.key).catch(() => undefined);
    Object.assign(it.result, { status: "duplicate", sampleId: of?.id, reason: `same content as ${of?.rel_path ?? "another file"}` });
  }
  private async recordOne(it: Stored, attempt = 1): Promise<void> {
    const { ctx } = this;
    try {
      const dup = await db()("samples").where({ library_id: ctx.libraryId, sha256: it.sha256 }).first("id", "rel_path");
      if (dup) return await this.duplicate(it, dup);
      await insertSamplesWithWords(db(), [this.row(it)]);
      this.markQueued(it);
      this.measure([it]);
    } catch (e) {
      const errno = (e as { errno?: number }).errno;
      // two uploads into one library can deadlock on its unique (library, hash) index: InnoDB rolls one back
      // (1213) and that one tries again (as the server's message asks), after a short random pause
      if ((errno === 1213 || errno === 1205) && attempt < 5) {
        await new Promise((r) => setTimeout(r, 20 + Math.random() * 80 * attempt));
        return this.recordOne(it, attempt + 1);
      }
      if (errno === 1062) return await this.duplicate(it, await db()("samples").where({ library_id: ctx.libraryId, sha256: it.sha256 }).first("id", "rel_path").catch(() => undefined));
      await storage().delete(it.key).catch(() => undefined);
      if (errno === 1452) Object.assign(it.result, { code: "error", reason: "the library no longer exists" });
      else if (e instanceof AppError) Object.assign(it.result, { code: "error", reason: e.message });
      else {
        console.error(e);
        Object.assign(it.result, { code: "error", reason: ERROR_REASON });
      }
    }
  }
}
