// kitwright command line: dispatches to one module per command. Static imports: under tsx the .ts files
// load as CommonJS (package.json has no "type"), where dynamic import of a .ts file does not resolve.
import * as measure from "./measure";
import * as catalogue from "./catalogue";
import * as audit from "./audit";
import * as upload from "./upload";
import * as suggest from "./suggest";

const COMMANDS: Record<string, { run(args: string[]): Promise<number> }> = { measure, catalogue, audit, suggest, upload };

const USAGE = `usage: kitwright <command> [options]

commands:
  measure <files or folders> [--json | --csv]     measure WAV one-shots, list refused files with reasons
  catalogue <folder> [--json | --csv] [--strokes <strokes.json>]
                                                  sort a folder into instruments, articulations, layers
  audit --layout <file|template> --catalogue <folder> [--kit <kit.json>] [--strokes <strokes.json>] ${audit.OUTPUT_USAGE}
                                                  audit a pad layout against a catalogued folder
  suggest --surface <rows>x<cols> --catalogue <folder> [--kit <kit.json>] [--strokes <strokes.json>]
                                                  suggest a layout for a pad grid (or --zones a,b,c) and a kit
  upload <folder or .zip> --library <id> --server <url> [--jobs N]
                                                  send WAV files to a library (token in $KITWRIGHT_TOKEN)

--strokes: a studio's own strokes (a kitwright.strokes/v1 file); "kitwright <command> --help" says more
`;

export async function main(argv: string[]): Promise<number> {
  const [cmd, ...rest] = argv;
  if (!cmd || cmd === "--help" || cmd === "-h" || cmd === "help") {
    process.stdout.write(USAGE);
    return cmd ? 0 : 2;
  }
  const mod = COMMANDS[cmd];
  if (!mod) {
    process.stderr.write(`kitwright: unknown command "${cmd}"\n\n${USAGE}`);
    return 2;
  }
  return mod.run(rest);
}
