// kitwright upload <folder or .zip> --library <id> --server <url> [--jobs N]
// Sends a folder's WAV files (the walk of cli/files.ts) or a zip pack's to a library through the HTTP API, with
// a personal API token from $KITWRIGHT_TOKEN. Before sending it asks which SHA-256 digests the library already
// holds and skips those; it sends the rest, several requests at once, one file per request through the same
// multipart upload route as the web page; a progress bar on a terminal, plain lines otherwise; a summary at the
// end. Interrupted (Ctrl-C), it saves what it knows (cli/upload-state.ts) and the same command later sends only
// what is missing. Exit codes: 0 all delivered, 1 a file was refused or could not be sent, 2 usage, 3 the server,
// token or library stopped it before any file was sent (or during the run: a token revoked), 130 interrupted.
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { parseArgs } from "node:util";
import cliProgress from "cli-progress";
import yauzl from "yauzl";
import { findWavs, WAV_NAME } from "./files";
import { RequestError, SetupError, UploadClient } from "./upload-api";
import { statePath, UploadState } from "./upload-state";
import { can, rolesWith } from "../lib/permissions";
import { MAX_HASH_LOOKUP } from "../lib/validation/token";

export const TOKEN_ENV = "KITWRIGHT_TOKEN";
export const SERVER_ENV = "KITWRIGHT_SERVER";
const DEFAULT_JOBS = 4;
const RETRIES = 3;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const USAGE = `usage: kitwright upload <folder or .zip> --library <id> --server <url> [--jobs N]

  Sends the WAV files of a folder (or of a .zip pack) to a library. The personal API token is read from
  $${TOKEN_ENV} (make one on your account page); --server may also come from $${SERVER_ENV}.
  Files the library already has (same SHA-256) are skipped; an interrupted run is resumed by the same command.
  --jobs N   requests at once (default ${DEFAULT_JOBS}, 1 to 16)
  exit code: 0 all delivered, 1 some file refused or not sent, 2 usage, 3 server/token/library problem, 130 interrupted
`;

interface SourceFile {
  relPath: string;
  stamp: string;
  size: number;
  read(): Promise<Blob>;
}

interface Source {
  files: SourceFile[];
  close(): void;
}

const fail = (msg: string): never => {
  throw new SetupError(msg);
};

async function folderSource(folder: string): Promise<Source> {
  const found = await findWavs(folder);
  const files = await Promise.all(
    found.map(async (p) => {
      const st = await fs.promises.stat(p);
      return { relPath: path.relative(folder, p).split(path.sep).join("/"), stamp: `${st.size}:${st.mtimeMs}`, size: st.size, read: () => fs.openAsBlob(p) };
    }),
  );
  return { files, close: () => {} };
}

function entryBytes(zip: yauzl.ZipFile, entry: yauzl.Entry): Promise<Blob> {
  return new Promise((resolve, reject) => {
    zip.openReadStream(entry, (err, stream) => {
      if (err || !stream) return reject(err ?? new Error("unreadable entry"));
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("error", reject);
      stream.on("end", () => resolve(new Blob([Buffer.concat(chunks)])));
    });
  });
}

/** The WAV entries of a zip pack (hidden entries and __MACOSX left out), named by their path in the pack. */
async function zipSource(file: string): Promise<Source> {
  const zip = await new Promise<yauzl.ZipFile>((resolve, reject) => yauzl.open(file, { lazyEntries: true, autoClose: false }, (err, z) => (err || !z ? reject(err) : resolve(z))));
  const files: SourceFile[] = [];
  await new Promise<void>((resolve, reject) => {
    zip.on("entry", (e: yauzl.Entry) => {
      const parts = e.fileName.split("/");
      if (!e.fileName.endsWith("/") && WAV_NAME.test(e.fileName) && !parts.some((p) => p.startsWith(".") || p === "__MACOSX"))
        files.push({ relPath: e.fileName, stamp: `${e.crc32}:${e.uncompressedSize}`, size: e.uncompressedSize, read: () => entryBytes(zip, e) });
      zip.readEntry();
    });
    zip.on("end", resolve);
    zip.on("error", reject);
    zip.readEntry();
  });
  return { files, close: () => zip.close() };
}

async function sha256Of(f: SourceFile): Promise<string> {
  const h = crypto.createHash("sha256");
  const blob = await f.read();
  await pipeline(blob.stream() as unknown as NodeJS.ReadableStream, h);
  return h.digest("hex");
}

/** Runs `work` on every item, at most `limit` at once, stopping early when `stopped()` says so. */
async function pool<T>(items: readonly T[], limit: number, work: (item: T) => Promise<void>, stopped: () => boolean): Promise<void> {
  let next = 0;
  const lane = async () => {
    while (next < items.length && !stopped()) await work(items[next++]!);
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(limit, items.length)) }, lane));
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

interface Tally {
  sent: string[];
  skipped: { relPath: string; why: string }[];
  refused: { relPath: string; reason: string }[];
  failed: { relPath: string; reason: string }[];
}

export async function run(args: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({ args, allowPositionals: true, options: { library: { type: "string" }, server: { type: "string" }, jobs: { type: "string" }, help: { type: "boolean", short: "h" } } });
  } catch (e) {
    process.stderr.write(`kitwright upload: ${(e as Error).message}\n\n${USAGE}`);
    return 2;
  }
  const { values, positionals } = parsed;
  if (values.help) {
    process.stdout.write(USAGE);
    return 0;
  }
  const usage = (msg: string) => {
    process.stderr.write(`kitwright upload: ${msg}\n\n${USAGE}`);
    return 2;
  };
  if (positionals.length !== 1) return usage("name one folder or .zip file to upload");
  const libraryId = (values.library ?? "").toLowerCase();
  if (!UUID.test(libraryId)) return usage(values.library ? `"${values.library}" is not a library id (the id is in the library page's address: /s/<studio>/libraries/<id>)` : "--library <id> is required");
  const serverText = values.server ?? process.env[SERVER_ENV] ?? "";
  let server: string;
  try {
    const u = new URL(serverText);
    if (u.protocol !== "http:" && u.protocol !== "https:") throw new Error("not http");
    server = u.origin;
  } catch {
    return usage(serverText ? `"${serverText}" is not a server address (write it as http://host:port)` : `--server <url> is required (or set $${SERVER_ENV})`);
  }
  const jobs = values.jobs === undefined ? DEFAULT_JOBS : Number(values.jobs);
  if (!Number.isInteger(jobs) || jobs < 1 || jobs > 16) return usage("--jobs takes a whole number from 1 to 16");
  const token = (process.env[TOKEN_ENV] ?? "").trim();
  if (!token) return usage(`set $${TOKEN_ENV} to a personal API token (make one on your account page, ${server}/account)`);
  const target = path.resolve(positionals[0]!);

  let source: Source | null = null;
  try {
    const client = new UploadClient(server, token);
    // 1. the token, its studio and role, and the library, before reading anything
    const who = await client.whoami().catch((e: unknown) => {
      if (e instanceof RequestError && e.status === 401) fail(`the server refused the token in $${TOKEN_ENV}: ${e.message}`);
      if (e instanceof RequestError && e.status === 403) fail(`the server refused the token in $${TOKEN_ENV}: ${e.message}`);
      throw e instanceof RequestError ? new SetupError(e.message) : e;
    });
    if (!who.token) fail(`$${TOKEN_ENV} is not a personal API token`);
    const t = who.token!;
    if (!t.role) fail(`the token "${t.name}" can do nothing now: ${who.user.name} is no longer a member of the studio "${t.studioName}"`);
    if (!can(t.role, "studio:write")) fail(`the token "${t.name}" acts as ${t.role} in "${t.studioName}": uploading needs the role of ${rolesWith("studio:write").join(" or ")}`);
    const library = await client.library(t.studioId, libraryId).catch((e: unknown) => {
      if (e instanceof RequestError && e.status === 404) fail(`the studio "${t.studioName}" (the token's studio) has no library ${libraryId}: copy the id from the library page's address`);
      throw e instanceof RequestError ? new SetupError(e.message) : e;
    });

    // 2. the files and their digests (remembered from an earlier run while a file is unchanged)
    let stat: fs.Stats;
    try {
      stat = await fs.promises.stat(target);
    } catch {
      return usage(`${positionals[0]} does not exist`);
    }
    source = stat.isDirectory() ? await folderSource(target) : /\.zip$/i.test(target) ? await zipSource(target).catch(() => fail(`${positionals[0]} is not a readable zip file`)) : fail(`${positionals[0]} is neither a folder nor a .zip file`);
    const files = source.files;
    if (!files.length) {
      process.stderr.write(`kitwright upload: no WAV files (.wav, .wave, .bwf) in ${positionals[0]}\n`);
      return 1;
    }
    const state = UploadState.load(statePath(server, libraryId, target), { server, libraryId, source: target });
    const tty = process.stderr.isTTY === true;
    const say = (line: string) => (tty ? undefined : process.stdout.write(`${line}\n`));
    say(`uploading ${files.length} files from ${positionals[0]} to "${library.name}" in "${t.studioName}" at ${server}`);

    let interrupted = false;
    const abort = new AbortController();
    const onSigint = () => {
      if (interrupted) process.exit(130);
      interrupted = true;
      abort.abort();
    };
    process.on("SIGINT", onSigint);
    process.on("SIGTERM", onSigint);

    const digests = new Map<SourceFile, string>();
    const hashBar = tty ? new cliProgress.SingleBar({ format: "reading   {bar} {value}/{total} files", stream: process.stderr, hideCursor: true }, cliProgress.Presets.shades_classic) : null;
    hashBar?.start(files.length, 0);
    await pool(files, Math.min(jobs, 4), async (f) => {
      let d = state.digest(f.relPath, f.stamp);
      if (!d) {
        d = await sha256Of(f);
        state.remember(f.relPath, { stamp: f.stamp, sha256: d });
      }
      digests.set(f, d);
      hashBar?.increment();
    }, () => interrupted);
    hashBar?.stop();
    state.save();

    // 3. ask which digests the library holds; the same content twice in the folder is sent once
    const tally: Tally = { sent: [], skipped: [], refused: [], failed: [] };
    const firstOf = new Map<string, SourceFile>();
    const unique: SourceFile[] = [];
    for (const f of files) {
      if (!digests.has(f)) continue;
      const d = digests.get(f)!;
      const first = firstOf.get(d);
      if (first) tally.skipped.push({ relPath: f.relPath, why: `same content as ${first.relPath}` });
      else {
        firstOf.set(d, f);
        unique.push(f);
      }
    }
    const known = new Set<string>();
    const all = [...firstOf.keys()];
    for (let i = 0; i < all.length && !interrupted; i += MAX_HASH_LOOKUP) {
      for (const k of (await client.known(t.studioId, libraryId, all.slice(i, i + MAX_HASH_LOOKUP))).known) known.add(k.sha256);
    }
    const toSend: SourceFile[] = [];
    for (const f of unique) {
      if (known.has(digests.get(f)!)) {
        tally.skipped.push({ relPath: f.relPath, why: state.wasDelivered(f.relPath) ? "sent by an earlier run" : "already in the library" });
        state.markDelivered(f.relPath);
      } else toSend.push(f);
    }
    say(`${files.length - toSend.length} already in the library or repeated, sending ${toSend.length} (${jobs} at once)`);

    // 4. send the rest
    const bar = tty
      ? new cliProgress.SingleBar({ format: "uploading {bar} {value}/{total} files | sent {sent} refused {refused} | {file}", stream: process.stderr, hideCursor: true }, cliProgress.Presets.shades_classic)
      : null;
    bar?.start(toSend.length, 0, { sent: 0, refused: 0, file: "" });
    let fatal: SetupError | null = null;
    let lastSave = Date.now();
    let answered = 0;
    const sendOne = async (f: SourceFile) => {
      for (let attempt = 1; ; attempt++) {
        try {
          const out = await client.upload(t.studioId, libraryId, { relPath: f.relPath, blob: await f.read() }, abort.signal);
          if (out.status === "refused") {
            tally.refused.push({ relPath: f.relPath, reason: out.reason ?? out.code ?? "refused" });
            say(`refused ${f.relPath}: ${out.reason ?? out.code}`);
          } else {
            state.markDelivered(f.relPath);
            if (out.status === "duplicate") tally.skipped.push({ relPath: f.relPath, why: "already in the library" });
            else tally.sent.push(f.relPath);
            say(`${out.status === "duplicate" ? "skipped" : "sent"} ${f.relPath}`);
          }
          answered++;
          break;
        } catch (e) {
          if (interrupted) return;
          const status = e instanceof RequestError ? e.status : -1;
          // the token, the role or the library went away mid-run: no other file will fare better
          if ([401, 403, 404].includes(status)) {
            fatal = new SetupError(`stopped: ${(e as Error).message}`);
            abort.abort();
            return;
          }
          const passing = status === 0 || status === 429 || status >= 500;
          if (passing && attempt < RETRIES) {
            await sleep(500 * 2 ** (attempt - 1));
            continue;
          }
          tally.failed.push({ relPath: f.relPath, reason: (e as Error).message });
          say(`not sent ${f.relPath}: ${(e as Error).message}`);
          answered++;
          break;
        }
      }
      bar?.increment({ sent: tally.sent.length, refused: tally.refused.length, file: f.relPath.slice(-40) });
      if (Date.now() - lastSave > 1000) {
        state.save();
        lastSave = Date.now();
      }
    };
    await pool(toSend, jobs, sendOne, () => interrupted || fatal !== null);
    bar?.stop();
    state.save();
    process.off("SIGINT", onSigint);
    process.off("SIGTERM", onSigint);

    // 5. the summary
    const notSent = toSend.length - answered;
    const out: string[] = [];
    out.push(`${interrupted ? "interrupted" : fatal ? "stopped" : "done"}: ${files.length} files in ${positionals[0]} for "${library.name}"`);
    out.push(`  sent     ${tally.sent.length}`);
    const earlier = tally.skipped.filter((s) => s.why === "sent by an earlier run").length;
    const repeated = tally.skipped.filter((s) => s.why.startsWith("same content")).length;
    const inLibrary = tally.skipped.length - repeated;
    const why = [inLibrary ? `${inLibrary} already in the library${earlier ? `, ${earlier} of them sent by an earlier run` : ""}` : "", repeated ? `${repeated} repeated in the folder` : ""].filter(Boolean);
    out.push(`  skipped  ${tally.skipped.length}${why.length ? ` (${why.join("; ")})` : ""}`);
    out.push(`  refused  ${tally.refused.length}`);
    for (const r of tally.refused) out.push(`    ${r.relPath}: ${r.reason}`);
    if (tally.failed.length) {
      out.push(`  not sent ${tally.failed.length} (run the same command again to retry them)`);
      for (const r of tally.failed) out.push(`    ${r.relPath}: ${r.reason}`);
    }
    if (interrupted || fatal) out.push(`  left     ${notSent} not sent yet${interrupted ? ": run the same command again to send them" : ""}`);
    process.stdout.write(`${out.join("\n")}\n`);
    if (fatal) {
      process.stderr.write(`kitwright upload: ${(fatal as SetupError).message}\n`);
      return 3;
    }
    if (interrupted) return 130;
    return tally.refused.length || tally.failed.length ? 1 : 0;
  } catch (e) {
    if (e instanceof SetupError || e instanceof RequestError) {
      process.stderr.write(`kitwright upload: ${e.message}\n`);
      return 3;
    }
    throw e;
  } finally {
    source?.close();
  }
}
