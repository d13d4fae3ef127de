// A progress bar on stderr for long work, drawn only when stderr is a terminal.
export function progressBar(
  label: string,
  stream: NodeJS.WriteStream = process.stderr,
): { update(done: number, total: number): void; end(): void } {
  const tty = Boolean(stream.isTTY);
  let last = -1;
  return {
    update(done, total) {
      if (!tty) return;
      const f = total > 0 ? Math.min(1, done / total) : 0;
      const pct = Math.floor(f * 100);
      if (pct === last) return;
      last = pct;
      const width = 30;
      const filled = Math.round(f * width);
      stream.write(
        `\r${label} [${"#".repeat(filled)}${".".repeat(width - filled)}] ${String(pct).padStart(3)}%`,
      );
    },
    end() {
      if (tty && last >= 0) stream.write("\n");
    },
  };
}
