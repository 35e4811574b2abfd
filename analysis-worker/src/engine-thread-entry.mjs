// Worker threads do not inherit the parent's TypeScript loader, so the thread registers tsx
// itself before loading the engine thread's source.
import { register } from "tsx/esm/api";

register();
await import("./engine-thread.ts");
