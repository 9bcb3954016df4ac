// Placeholder until the engine behind "fit" lands; replaced by that engine's verb module.
import { AppError } from "../../errors/app-error";

export function run(_input: unknown): unknown {
  throw new AppError("internal", 'The "fit" verb is not built yet.');
}
