// kitwright command line: dispatches to one module per command.
const COMMANDS: Record<string, () => Promise<{ run(args: string[]): Promise<number> }>> = {
  measure: () => import("./measure"),
  catalogue: () => import("./catalogue"),
  audit: () => import("./audit"),
};

const USAGE = `usage: kitwright <command> [options]

commands:
  measure <files or folders> [--json | --csv]     measure WAV one-shots, list refused files with reasons
  catalogue <folder> [--json | --csv]             sort a folder into instruments, articulations, layers
  audit --layout <file|template> --catalogue <folder> [--kit <kit.json>] [--json | --csv]
                                                  audit a pad layout against a catalogued folder
`;

export async function main(argv: string[]): Promise<number> {
  const [cmd, ...rest] = argv;
  if (!cmd || cmd === "--help" || cmd === "-h" || cmd === "help") {
    process.stdout.write(USAGE);
    return cmd ? 0 : 2;
  }
  const load = COMMANDS[cmd];
  if (!load) {
    process.stderr.write(`kitwright: unknown command "${cmd}"\n\n${USAGE}`);
    return 2;
  }
  try {
    const mod = await load();
    return await mod.run(rest);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ERR_MODULE_NOT_FOUND") {
      process.stderr.write(`kitwright: the "${cmd}" command is not built yet\n`);
      return 2;
    }
    throw e;
  }
}
