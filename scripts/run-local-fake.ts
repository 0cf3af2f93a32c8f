// Runs one local stand-in (mail receiver, payment provider, S3 bucket) until SIGINT/SIGTERM,
// closing it cleanly; a taken port is named with the variable that moves it.
export async function runLocalFake(tag: string, portVariables: string, start: () => Promise<{ close: () => Promise<unknown> }>): Promise<void> {
  try {
    const fake = await start();
    const stop = () => void fake.close().then(() => process.exit(0));
    process.on("SIGINT", stop);
    process.on("SIGTERM", stop);
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    if (err.code === "EADDRINUSE") console.error(`[${tag}] port ${err.message.match(/:(\d+)/)?.[1] ?? "?"} is taken; set ${portVariables} to a free port`);
    else console.error(`[${tag}] failed to start:`, err.message);
    process.exit(1);
  }
}
