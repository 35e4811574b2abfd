/** Structured log lines (one JSON object a line) for the worker. */
import pino from "pino";

export const logger = pino({
  base: { service: "analysis-worker", pid: process.pid },
  level: process.env.LOG_LEVEL ?? "info",
});
