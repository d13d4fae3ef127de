#!/usr/bin/env node
// The `yieldloop` command: loads the TypeScript sources through tsx and runs the CLI.
import { register } from "tsx/esm/api";

register();
await import("../server/cli/main.ts");
