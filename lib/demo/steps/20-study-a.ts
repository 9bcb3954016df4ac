import "server-only";
import { createPlan } from "@/lib/plans/server/create-plan";
import { createStudy } from "@/lib/studies/server/create-study";
import { demoStep } from "../step";
import { STUDY_A_FACTORS as F, studyARecipe } from "../study-a";

/**
 * Study A (PRODUCT.md "Demo scenario"; invented) and its two plans, by the demo chemist:
 *
 * - the screen: a 2^(5−1) fractional factorial (E = ABCD, resolution V) on temperature
 *   60–100 °C, base 1.5–3.0 equiv, boronic acid 1.1–1.5 equiv, Pd 0.5–2.0 mol % and water
 *   fraction 0.1–0.3, with two centre points: 18 vials on the 24-position block;
 * - the Box–Behnken plan on the three factors that mattered in the screen — temperature
 *   (now 80–110 °C), base and Pd loading — with three centre points: 15 vials. Its 110 °C
 *   runs are above the solvents' boiling points in a sealed vial, so it needs sign-off (not
 *   blocked: about 2.7 bar against the lab's 5 bar for these vials, step 10).
 *
 * Records: studyA, studyA.screen, studyA.boxBehnken. Later steps give the screen its results
 * (which should show temperature, base and Pd loading mattering) and run the Box–Behnken plan.
 */
export default demoStep("Study A: Suzuki–Miyaura screen and Box–Behnken plan", async (ctx, t) => {
  const chemist = { labId: ctx.lab.id, actorUserId: ctx.users.chemist };
  const study = await createStudy(
    {
      ...chemist,
      input: {
        name: "Study A — Suzuki–Miyaura coupling of 4-bromoanisole with pyridin-3-ylboronic acid",
        goal: "Maximise the assay yield of the biaryl; keep the homocoupling impurity under 2 area %.",
        targetProduct: "3-(4-methoxyphenyl)pyridine",
        responses: [
          { name: "yield", unit: "%", goal: "maximize", low: 0, high: 100 },
          { name: "homocoupling", unit: "area %", goal: "minimize", low: 0, high: 2 },
        ],
      },
    },
    t,
  );
  ctx.remember("studyA", study.id);

  const screen = await createPlan(
    {
      ...chemist,
      studyId: study.id,
      input: {
        document: {
          name: "Study A — screen 1: 2^(5−1) on temperature, base, boronic acid, Pd and water",
          recipe: await studyARecipe(ctx, t),
          factors: [F.temperature(60, 100), F.baseEquiv, F.boronicEquiv, F.pdLoading, F.waterFraction],
          design: { design: "fractional-factorial", generators: ["E=ABCD"], centerPoints: 2, randomize: true, seed: 11 },
          block: "kb-al-24",
        },
      },
    },
    t,
  );
  ctx.remember("studyA.screen", screen.id);

  const bb = await createPlan(
    {
      ...chemist,
      studyId: study.id,
      input: {
        document: {
          name: "Study A — Box–Behnken on temperature, base and Pd loading",
          recipe: await studyARecipe(ctx, t),
          factors: [F.temperature(80, 110), F.baseEquiv, F.pdLoading],
          design: { design: "box-behnken", centerPoints: 3, randomize: true, seed: 12 },
          block: "kb-al-24",
        },
      },
    },
    t,
  );
  ctx.remember("studyA.boxBehnken", bb.id);
  ctx.log(`study ${study.id}: screen ${screen.runCount} runs, Box–Behnken ${bb.runCount} runs`);
});
