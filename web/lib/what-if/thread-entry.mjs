// Worker threads do not inherit a TypeScript loader (the web bundle has none, tests use Vite's),
// so the thread registers tsx itself before loading the what-if runner's source.
import { register } from "tsx/esm/api";

register();
await import("./what-if-thread.ts");
