import "server-only";
import { createPlan } from "@/lib/plans/server/create-plan";
import { createStudy } from "@/lib/studies/server/create-study";
import { demoStep } from "../step";

/**
 * Study B (PRODUCT.md "Demo scenario"; invented): halogen–lithium exchange of 3-bromoanisole
 * with n-butyllithium (2.5 M in hexanes) in THF at low temperature, then a triisopropyl borate
 * quench, by the demo chemist. One plan: a 2^3 full factorial on temperature −78 to −40 °C,
 * n-BuLi 1.05–1.25 equiv and borate 1.2–2.0 equiv with three centre points, 2.0 mmol in
 * 3.3 mL per 8 mL septum vial on the cooling block.
 *
 * It is the pyrophoric review path: n-butyllithium is pyrophoric and water-reactive in the
 * inventory, so the plan needs a safety officer's sign-off, and the 11 vials take about
 * 11 mL of it — past the lab's 10 mL second-person volume and more than the one usable
 * container holds (8 mL; the other is expired and quarantined, as seeded): release will
 * find it short. The THF container the inventory proposes was opened long ago, so its
 * peroxide test is due. Records: studyB, studyB.exchange.
 */
export default demoStep("Study B: halogen–lithium exchange and borate quench", async (ctx, t) => {
  const chemist = { labId: ctx.lab.id, actorUserId: ctx.users.chemist };
  const id = (name: string) => ctx.chemicalId(name, t);
  const study = await createStudy(
    {
      ...chemist,
      input: {
        name: "Study B — halogen–lithium exchange of 3-bromoanisole and borate quench",
        goal: "Maximise the assay yield of the arylboronic acid after the quench; keep the protodebromination product (anisole) under 3 area %.",
        targetProduct: "3-methoxyphenylboronic acid",
        responses: [
          { name: "yield", unit: "%", goal: "maximize", low: 0, high: 100 },
          { name: "anisole", unit: "area %", goal: "minimize", low: 0, high: 3 },
        ],
      },
    },
    t,
  );
  ctx.remember("studyB", study.id);

  const plan = await createPlan(
    {
      ...chemist,
      studyId: study.id,
      input: {
        document: {
          name: "Study B — exchange and quench: 2^3 on temperature, n-BuLi and borate",
          recipe: {
            limitingReagent: "arBr",
            scaleMmol: 2,
            concentrationM: 0.6,
            temperatureC: -78,
            timeH: 1,
            components: [
              { id: "arBr", name: "3-Bromoanisole", role: "reagent", chemicalId: await id("3-Bromoanisole"), formula: "C7H7BrO", form: { state: "liquid", densityGPerMl: 1.477, purityWtPercent: 98 } },
              {
                id: "buli",
                name: "n-Butyllithium, 2.5 M in hexanes",
                role: "reagent",
                chemicalId: await id("n-Butyllithium, 2.5 M in hexanes"),
                formula: "C4H9Li",
                equivalents: 1.1,
                form: { state: "solution", molarityM: 2.5, solvent: "hexanes" },
                dispense: "neat",
                addOrder: 500,
              },
              {
                id: "borate",
                name: "Triisopropyl borate",
                role: "reagent",
                chemicalId: await id("Triisopropyl borate"),
                formula: "C9H21BO3",
                equivalents: 1.5,
                form: { state: "liquid", densityGPerMl: 0.815, purityWtPercent: 98 },
                dispense: "neat",
                addOrder: 600,
              },
            ],
            solvents: [{ name: "tetrahydrofuran", volumeFraction: 1, chemicalId: await id("Tetrahydrofuran, anhydrous") }],
          },
          factors: [
            { name: "temperature", low: -78, high: -40, unit: "degC", binding: { kind: "temperature" } },
            { name: "buliEquiv", low: 1.05, high: 1.25, unit: "equiv", binding: { kind: "equivalents", component: "buli" } },
            { name: "borateEquiv", low: 1.2, high: 2, unit: "equiv", binding: { kind: "equivalents", component: "borate" } },
          ],
          design: { design: "full-factorial", centerPoints: 3, randomize: true, seed: 21 },
          vessel: "kb-vial-8ml-septum",
          block: "kb-cool-24",
        },
      },
    },
    t,
  );
  ctx.remember("studyB.exchange", plan.id);
  ctx.log(`study ${study.id}: exchange plan ${plan.runCount} runs, sign-off ${plan.signOffRequired ? "required" : "not required"}`);
});
