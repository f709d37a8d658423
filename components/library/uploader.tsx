"use client";
// Upload: drop files, whole folders (relative paths kept) or .zip packs, or pick them. Each file goes in its own
// request (three at a time, sent by components/data/uploads.ts) so every file has its own progress bar; the
// batch bar sums the bytes sent. At the end a summary: queued for measuring / duplicates / refused with reasons.
import { useCallback, useEffect, useRef, useState } from "react";
import { useUploads } from "../data/uploads";

interface Item { id: number; file: File; path: string; loaded: number; state: "waiting" | "sending" | "done" | "failed"; results: { name: string; status: string; reason?: string }[] }

const CONCURRENCY = 3;

// File System Entry API (drag and drop of folders)
interface FsEntry { isFile: boolean; isDirectory: boolean; fullPath: string; name: string }
interface FsFileEntry extends FsEntry { file(ok: (f: File) => void, err: (e: unknown) => void): void }
interface FsDirEntry extends FsEntry { createReader(): { readEntries(ok: (e: FsEntry[]) => void, err: (e: unknown) => void): void } }

async function walk(entry: FsEntry, out: { file: File; path: string }[]): Promise<void> {
  if (entry.isFile) {
    const file = await new Promise<File>((res, rej) => (entry as FsFileEntry).file(res, rej));
    out.push({ file, path: entry.fullPath.replace(/^\/+/, "") });
  } else if (entry.isDirectory) {
    const reader = (entry as FsDirEntry).createReader();
    for (;;) {
      const batch = await new Promise<FsEntry[]>((res, rej) => reader.readEntries(res, rej));
      if (!batch.length) break;
      for (const e of batch) await walk(e, out);
    }
  }
}

const wanted = (p: string) => /\.(wav|wave|zip)$/i.test(p) && !p.split("/").some((x) => x.startsWith("."));

export function Uploader({ studioId, libraryId }: { studioId: string; libraryId: string }) {
  const [items, setItems] = useState<Item[]>([]);
  const [over, setOver] = useState(false);
  const [running, setRunning] = useState(false);
  // set once the inputs have their handlers (hydrated): browser tests wait for it before choosing files
  const [ready, setReady] = useState(false);
  useEffect(() => setReady(true), []);
  const seq = useRef(0);
  const uploads = useUploads(studioId, libraryId);

  // Sends the given items, CONCURRENCY at a time; failed ones (connection lost, server restarted, 5xx) stay
  // listed with their reason and can be sent again.
  const run = useCallback(
    async (list: Item[]) => {
      if (!list.length) return;
      setRunning(true);
      const update = (id: number, patch: Partial<Item>) => setItems((xs) => xs.map((x) => (x.id === id ? { ...x, ...patch } : x)));
      let next = 0;
      const lane = async () => {
        while (next < list.length) {
          const item = list[next++]!;
          update(item.id, { state: "sending", loaded: 0 });
          const r = await uploads.send(item.file, item.path, (loaded) => update(item.id, { loaded }));
          if (r.ok) update(item.id, { state: "done", loaded: item.file.size, results: r.files });
          else update(item.id, { state: "failed", results: [{ name: item.path, status: "refused", reason: r.reason }] });
          uploads.fileSent();
        }
      };
      await Promise.all(Array.from({ length: CONCURRENCY }, lane));
      setRunning(false);
      uploads.batchSent();
    },
    [uploads],
  );

  const start = useCallback(
    (picked: { file: File; path: string }[]) => {
      const list: Item[] = picked.filter((p) => wanted(p.path)).map((p) => ({ id: ++seq.current, file: p.file, path: p.path, loaded: 0, state: "waiting", results: [] }));
      const skipped: Item[] = picked.filter((p) => !wanted(p.path)).map((p) => ({ id: ++seq.current, file: p.file, path: p.path, loaded: 0, state: "done", results: [{ name: p.path, status: "refused", reason: "not a .wav file or .zip pack; not sent" }] }));
      setItems([...list, ...skipped]);
      return run(list);
    },
    [run],
  );

  const retryFailed = () => {
    const failed = items.filter((i) => i.state === "failed");
    setItems((xs) => xs.map((x) => (x.state === "failed" ? { ...x, state: "waiting", loaded: 0, results: [] } : x)));
    void run(failed);
  };

  const onDrop = async (e: React.DragEvent) => {
    e.preventDefault();
    setOver(false);
    if (running) return;
    const out: { file: File; path: string }[] = [];
    const entries = [...e.dataTransfer.items].map((i) => (i as DataTransferItem & { webkitGetAsEntry(): FsEntry | null }).webkitGetAsEntry?.()).filter(Boolean) as FsEntry[];
    if (entries.length) for (const en of entries) await walk(en, out);
    else for (const f of [...e.dataTransfer.files]) out.push({ file: f, path: f.name });
    start(out);
  };
  const fromInput = (files: FileList | null) => {
    if (!files) return;
    start([...files].map((f) => ({ file: f, path: (f as File & { webkitRelativePath?: string }).webkitRelativePath || f.name })));
  };

  const total = items.reduce((s, i) => s + i.file.size, 0);
  const loaded = items.reduce((s, i) => s + (i.state === "done" || i.state === "failed" ? i.file.size : Math.min(i.loaded, i.file.size)), 0);
  const results = items.flatMap((i) => i.results);
  const count = (s: string) => results.filter((r) => r.status === s).length;
  const finished = items.length > 0 && !running;
  const refused = results.filter((r) => r.status === "refused");
  const failedCount = items.filter((i) => i.state === "failed").length;

  return (
    <section className="card space-y-3" id="add-samples" data-testid="uploader" data-ready={ready ? "" : undefined}>
      <h3 className="font-semibold">Add samples</h3>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={`rounded-md border-2 border-dashed p-4 text-center text-sm ${over ? "border-brand bg-brand-soft" : "border-line"}`}
      >
        <p>Drop WAV files, whole folders or .zip packs here.</p>
        <p className="mt-1 text-xs text-muted">Folder and file names are kept: they help the cataloguing. At most 200 MB per file.</p>
        <div className="mt-3 flex flex-wrap justify-center gap-2">
          <label className="btn-quiet cursor-pointer">
            Choose files
            <input type="file" multiple accept=".wav,.wave,.zip,audio/wav" className="sr-only" data-testid="file-input" disabled={running} onChange={(e) => fromInput(e.target.files)} />
          </label>
          <label className="btn-quiet cursor-pointer">
            Choose a folder
            <input type="file" className="sr-only" data-testid="folder-input" disabled={running} onChange={(e) => fromInput(e.target.files)} {...({ webkitdirectory: "", directory: "" } as Record<string, string>)} />
          </label>
        </div>
      </div>
      {items.length > 0 && (
        <div className="space-y-2">
          <div className="flex justify-between text-xs">
            <span>{running ? "Sending" : "Sent"} {items.filter((i) => i.state === "done" || i.state === "failed").length} of {items.length} files</span>
            <span className="num">{(loaded / 1024 / 1024).toFixed(1)} / {(total / 1024 / 1024).toFixed(1)} MB</span>
          </div>
          <div className="h-2 w-full overflow-hidden rounded bg-paper" role="progressbar" aria-label="Batch upload" aria-valuemin={0} aria-valuemax={100} aria-valuenow={total ? Math.round((loaded / total) * 100) : 0}>
            <div className="h-full bg-brand" style={{ width: `${total ? (loaded / total) * 100 : 0}%` }} />
          </div>
          <ul className="max-h-40 space-y-1 overflow-y-auto text-xs" data-testid="upload-files" tabIndex={0} aria-label="Files of this upload">
            {items.slice(0, 300).map((i) => (
              <li key={i.id} className="grid grid-cols-[minmax(0,1fr)_90px_70px] items-center gap-2">
                <span className="truncate" title={i.path}>{i.path}</span>
                <span className="h-1.5 overflow-hidden rounded bg-paper" role="progressbar" aria-label={`Upload of ${i.path}`} aria-valuenow={i.file.size ? Math.round((Math.min(i.loaded, i.file.size) / i.file.size) * 100) : 100}>
                  <span className="block h-full bg-brand" style={{ width: `${i.state === "done" || i.state === "failed" ? 100 : i.file.size ? (i.loaded / i.file.size) * 100 : 0}%` }} />
                </span>
                <span className="text-right">{i.state === "done" ? (i.results.some((r) => r.status === "refused") ? "✕ refused" : i.results.some((r) => r.status === "duplicate") ? "= duplicate" : "✓ sent") : i.state === "failed" ? "✕ failed" : i.state === "sending" ? "sending" : "waiting"}</span>
              </li>
            ))}
            {items.length > 300 && <li className="text-muted">… and {items.length - 300} more</li>}
          </ul>
        </div>
      )}
      {finished && (
        <div className="space-y-2 rounded-md border border-line bg-paper p-3 text-sm" data-testid="upload-summary" role="status">
          <p>
            <strong>Upload finished:</strong> <span className="num">{count("queued")}</span> queued for measuring, <span className="num">{count("duplicate")}</span> duplicates (already in the library, not stored twice),{" "}
            <span className="num">{refused.length}</span> refused.
          </p>
          {failedCount > 0 && (
            <div className="flex flex-wrap items-center gap-2" data-testid="upload-failed">
              <span className="text-bad">✕ {failedCount} {failedCount === 1 ? "file" : "files"} did not get through (the connection dropped, or the server was restarting or busy). Sending again is safe: anything already stored is only reported as a duplicate.</span>
              <button type="button" className="btn-quiet py-1" onClick={retryFailed}>Send {failedCount === 1 ? "it" : "them"} again</button>
            </div>
          )}
          {refused.length > 0 && (
            <ul className="max-h-32 list-disc overflow-y-auto pl-5 text-xs" data-testid="refused-list" tabIndex={0} aria-label="Refused files">
              {refused.slice(0, 200).map((r, k) => <li key={k}><span className="font-medium">{r.name}</span>: {r.reason}</li>)}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
