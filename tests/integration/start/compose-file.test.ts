// The compose file is not run here (no Docker engine), so this keeps it valid by hand: the
// services, replica counts, volumes and commands it names must exist in the repository.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { parse } from "yaml";
import { describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";

const ROOT = projectRoot();
const compose = parse(readFileSync(path.join(ROOT, "docker-compose.yml"), "utf8"), {
  merge: true,
}) as {
  services: Record<
    string,
    {
      command?: string[];
      deploy?: { replicas?: number };
      volumes?: string[];
      environment?: Record<string, string>;
    }
  >;
  volumes: Record<string, unknown>;
};

describe("docker-compose.yml", () => {
  it("has Postgres, two web replicas and two worker replicas", () => {
    expect(Object.keys(compose.services)).toEqual(
      expect.arrayContaining(["postgres", "web", "worker"]),
    );
    expect(compose.services.web!.deploy?.replicas).toBe(2);
    expect(compose.services.worker!.deploy?.replicas).toBe(2);
  });

  it("points web and worker at the compose Postgres", () => {
    for (const name of ["web", "worker"])
      expect(compose.services[name]!.environment?.DATABASE_URL).toMatch(/@postgres:5432\//);
  });

  it("declares every named volume it mounts", () => {
    for (const svc of Object.values(compose.services))
      for (const v of svc.volumes ?? []) {
        const source = v.split(":")[0]!;
        if (!source.startsWith(".") && !source.startsWith("/"))
          expect(compose.volumes).toHaveProperty(source);
        else expect(existsSync(path.join(ROOT, source))).toBe(true);
      }
  });

  it("runs files that exist in the repository", () => {
    for (const svc of Object.values(compose.services))
      for (const arg of svc.command ?? [])
        if (/\.(ts|js)$/.test(arg) || arg.startsWith("node_modules/"))
          expect(existsSync(path.join(ROOT, arg)), arg).toBe(true);
  });
});
