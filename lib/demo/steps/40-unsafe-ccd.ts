import "server-only";
import { createPlan } from "@/lib/plans/server/create-plan";
import { demoStep } from "../step";
import { STUDY_A_FACTORS as F, studyARecipe } from "../study-a";

/**
 * The plan that shows the safe-design alternatives (issue 10, "Safe design"): Study A's
 * coupling with the solvent switched to THF/water (9:1), as a rotatable central composite
 * design on temperature 85–115 °C, base and boronic acid equivalents, three centre points
 * (17 vials). Its +α temperature run, 100 + 1.682 × 15 = 125.2 °C, is estimated at about
 * 5.3 bar in the sealed 4 mL vial, over the lab's 5 bar (10 bar × 0.5, step 10): a blocking
 * caution (TL-V02), which the editor's safe-design panel names, with its alternatives
 * (face-centred, inscribed, α ≈ 1.47, temperature 85–112.6 °C, D-optimal without the blocked
 * points). Records: studyA.unsafeCcd.
 */
export default demoStep("Study A: rotatable CCD in THF/water with axial runs past the vial's rating", async (ctx, t) => {
  const plan = await createPlan(
    {
      labId: ctx.lab.id,
      actorUserId: ctx.users.chemist,
      studyId: ctx.recall("studyA"),
      input: {
        document: {
          name: "Study A — CCD in THF/water (solvent switch), rotatable",
          recipe: await studyARecipe(ctx, t, "thf-water"),
          factors: [F.temperature(85, 115), F.baseEquiv, F.boronicEquiv],
          design: { design: "central-composite", alpha: "rotatable", centerPoints: 3, randomize: true, seed: 13 },
          block: "kb-al-24",
        },
      },
    },
    t,
  );
  ctx.remember("studyA.unsafeCcd", plan.id);
  const blocking = plan.cautions.filter((c) => c.severity === "blocking");
  ctx.log(`plan ${plan.id}: ${plan.runCount} runs; blocking ${blocking.map((c) => `${c.code} runs ${c.runs.join(", ")}`).join("; ") || "none"}`);
});
