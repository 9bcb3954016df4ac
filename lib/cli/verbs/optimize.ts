// Placeholder until the engine behind "optimize" lands; replaced by that engine's verb module.
import { AppError } from "../../errors/app-error";

export function run(_input: unknown): unknown {
  throw new AppError("internal", 'The "optimize" verb is not built yet.');
}
