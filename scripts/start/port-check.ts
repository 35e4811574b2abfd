/** Tells whether a TCP port can be bound, so the start fails early with a clear message. */
import net from "node:net";

/** Resolves to null when the port is free, or to a plain reason when it is not. */
export function portProblem(port: number, host = "0.0.0.0"): Promise<string | null> {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once("error", (err: NodeJS.ErrnoException) =>
      resolve(
        err.code === "EADDRINUSE"
          ? `port ${port} is already in use (set PORT to another port, or stop what uses it)`
          : `cannot listen on port ${port}: ${err.message}`,
      ),
    );
    srv.listen(port, host, () => srv.close(() => resolve(null)));
  });
}
