// Placeholder until the engine behind "molar-mass" lands; replaced by that engine's verb module.
import { AppError } from "../../errors/app-error";

export function run(_input: unknown): unknown {
  throw new AppError("internal", 'The "molar-mass" verb is not built yet.');
}
