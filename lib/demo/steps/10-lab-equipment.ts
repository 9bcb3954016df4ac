import "server-only";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { updateLabSettings } from "@/lib/lab-settings/server/update-lab-settings";
import { demoStep } from "../step";

/**
 * The demo lab's vessels, blocks and dispensing limits, set by its lab admin through the
 * settings operation (audited as any change of the settings page), chosen so that the demo's
 * plans are safe as designed (REFERENCE.md §2 and §5; the values are the invented lab's own):
 *
 * - Study A runs in sealed 4 mL crimp-top vials rated 10 bar absolute. With the lab's
 *   safety factor left at its default, 0.5 ("keep the estimate at or below about half the
 *   rating", common practice, REFERENCE.md §2), runs may reach 5 bar: the Box–Behnken
 *   plan's hottest runs (dioxane/water at 110 °C) are estimated at about 2.7 bar. The
 *   default screw-cap septum vial (≈3 bar, not pressure-rated by its makers, from memory)
 *   allows 1.5 bar and would block them. Crimp-cap vials are typically rated about 20 bar
 *   (from memory); the lab takes half of that for its 4 mL vials. Working volume 0.5–2 mL,
 *   the usual range of 4 mL vials in a 24-position block (common practice, REFERENCE.md §5);
 *   fill at most 60 % (common practice: ½–⅔, never above ~75 %).
 * - Study B runs cold in 8 mL septum vials under argon on a 24-position cooling block in dry
 *   ice/acetone (−78 °C, common practice); a screw-cap septum vial is treated as ≈3 bar
 *   (from memory / common practice) and marked as not confirmed with the supplier.
 * - Study A's block: aluminium, 24 positions, used to 150 °C routinely (common practice).
 * - The lab weighs on a 5-place balance: smallest mass weighed 8.2 mg (USP ⟨41⟩ minimum
 *   weight for a 5-place balance, from memory, REFERENCE.md §5).
 *
 * The default vessels and blocks stay in the lists (other plans may name them).
 */
export default demoStep("Kestrel Bay's vessels, blocks and dispensing limits", async (ctx, t) => {
  const actor = { labId: ctx.lab.id, actorUserId: ctx.users.admin };
  let { version, settings } = await getLabSettings({ labId: ctx.lab.id }, t);

  const vessels = {
    defaultId: "kb-vial-4ml-crimp",
    types: [
      {
        id: "kb-vial-4ml-crimp",
        name: "4 mL crimp-top vial, PTFE/silicone septum (24-position block)",
        totalVolumeMl: 4,
        workingMinMl: 0.5,
        workingMaxMl: 2,
        ratedBar: 10,
        maxFillFraction: 0.6,
        sealed: true,
        confirmWithSupplier: false,
        source:
          "Demo lab record (invented): rated 10 bar absolute by the lab, half the ≈20 bar typical of crimp-cap vials (from memory); working volume 0.5–2 mL as usual for 4 mL vials in a 24-position block, fill at most 60 % (common practice).",
      },
      {
        id: "kb-vial-8ml-septum",
        name: "8 mL screw-cap septum vial under argon (24-position cooling block)",
        totalVolumeMl: 8,
        workingMinMl: 1,
        workingMaxMl: 4,
        ratedBar: 3,
        maxFillFraction: 2 / 3,
        sealed: true,
        confirmWithSupplier: true,
        source: "Screw-cap septum vials are not pressure-rated by their makers: treated as ≈3 bar absolute (from memory / common practice). Used cold, for Study B.",
      },
      ...settings.vessels.types.filter((v) => !v.id.startsWith("kb-")),
    ],
  };
  ({ version, settings } = await updateLabSettings({ ...actor, section: "vessels", input: { version, value: vessels } }, t));

  const blocks = {
    defaultId: "kb-al-24",
    types: [
      {
        id: "kb-al-24",
        name: "Aluminium heating block, 24 positions (4 mL vials)",
        positions: 24,
        mode: "heating",
        minC: 20,
        maxC: 150,
        source: "Demo lab record (invented): aluminium heating blocks are used to 150 °C routinely (common practice); lowest, room temperature.",
      },
      {
        id: "kb-cool-24",
        name: "Cooling block, 24 positions (8 mL vials), dry ice/acetone",
        positions: 24,
        mode: "cooling",
        minC: -78,
        maxC: 25,
        source: "Dry ice/acetone holds −78 °C (common practice); up to room temperature as it warms.",
      },
      ...settings.blocks.types.filter((b) => !b.id.startsWith("kb-")),
    ],
  };
  ({ version, settings } = await updateLabSettings({ ...actor, section: "blocks", input: { version, value: blocks } }, t));

  await updateLabSettings({ ...actor, section: "dispensing", input: { version, value: { ...settings.dispensing, minWeighMassMg: 8.2 } } }, t);
  ctx.log("vessels kb-vial-4ml-crimp (10 bar, default) and kb-vial-8ml-septum; blocks kb-al-24 (default) and kb-cool-24; minimum weighing 8.2 mg");
});
