// Preloaded into each child of the start script (the worker and the web server): the child's
// stdin is a pipe from the start script, and it closes when the start script dies for any
// reason, even SIGKILL. The child then stops itself, so no process is ever left behind.
// Only in the main thread: preloads also run in module-loader and worker threads, whose
// stdin is empty and ends at once.
"use strict";
const { isMainThread } = require("node:worker_threads");
if (process.env.TEARDOWN_EXIT_WITH_PARENT === "1" && isMainThread) {
  process.stdin.on("end", () => process.kill(process.pid, "SIGTERM"));
  process.stdin.on("error", () => process.kill(process.pid, "SIGTERM"));
  process.stdin.resume();
}
