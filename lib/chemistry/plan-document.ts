/**
 * The plan document: one JSON document for a whole plan — recipe, factors with their
 * bindings, design, vessel, lab thresholds, equipment and dispensing settings. The app
 * exports and imports it, and `cli plan` reads it (the README's `plan` verb).
 *
 * Every quantity carries its unit in its field name (`scaleMmol`, `densityGPerMl`,
 * `finalVolumeUl`, `solubilityMgPerMl`), or in the factor's `unit`.
 */
import { z } from "zod";
import { factorSchema } from "../doe/factors";
import { hazardFlagFields } from "../hazards/hazard-flags";
import { isoDateSchema } from "../hazards/iso-date";
import { containerDateFields } from "../hazards/plan-cautions/schema";
import { blockSchema, equipmentSchema, labThresholdsSchema } from "../hazards/thresholds";
import { vesselTypeSchema, type VesselType } from "../hazards/vessels";

/**
 * Parses `value` with `schema` inside a transform, reporting its issues at their own
 * paths (a plain union would report only "invalid input" at the union's path).
 */
function refineWith<S extends z.ZodType>(value: unknown, schema: S, ctx: z.RefinementCtx): z.output<S> {
  const r = schema.safeParse(value);
  if (r.success) return r.data;
  for (const issue of r.error.issues) ctx.addIssue({ code: "custom", path: issue.path.map((p) => (typeof p === "symbol" ? String(p) : p)), message: issue.message });
  return z.NEVER;
}

/** Identifiers of components: used by bindings, stocks and the output. */
export const COMPONENT_ID_PATTERN = /^[A-Za-z][A-Za-z0-9_-]*$/;
const componentId = z
  .string()
  .regex(COMPONENT_ID_PATTERN, "must start with a letter and contain only letters, digits, _ and -");

/**
 * A chemical of the lab's inventory (its id). Release reserves containers of it, and its
 * hazard facts (statements, flags, class, container dates) come from the inventory
 * (`applyInventoryFacts`): dates typed into a linked component are overwritten.
 */
const chemicalId = z.uuid("must be the id of a chemical of the lab's inventory");

/**
 * A component's hazards as the hazard engine's caution rules read them
 * (lib/hazards/hazard-flags.ts): GHS statements, flags, peroxide class and the dates of
 * the container in use.
 */
export const componentHazardsSchema = z.strictObject({ ...hazardFlagFields, ...containerDateFields }).prefault({});

/** How a component is supplied. */
export const formSchema = z.discriminatedUnion("state", [
  z.strictObject({
    state: z.literal("solid"),
    /** Assay, weight percent (100 = pure). */
    purityWtPercent: z.number().gt(0).max(100).default(100),
  }),
  z.strictObject({
    /** A neat liquid. */
    state: z.literal("liquid"),
    densityGPerMl: z.number().gt(0).max(25),
    purityWtPercent: z.number().gt(0).max(100).default(100),
  }),
  z
    .strictObject({
      /** A solution as supplied (e.g. n-butyllithium 2.5 M in hexanes). */
      state: z.literal("solution"),
      molarityM: z.number().gt(0).max(100).optional(),
      wtPercent: z.number().gt(0).max(100).optional(),
      densityGPerMl: z.number().gt(0).max(25).optional(),
      /** The carrier solvent, for the record (e.g. "hexanes"). */
      solvent: z.string().min(1).max(200).optional(),
    })
    .superRefine((f, ctx) => {
      if (f.molarityM === undefined && (f.wtPercent === undefined || f.densityGPerMl === undefined)) {
        ctx.addIssue({ code: "custom", path: ["molarityM"], message: "give molarityM, or wtPercent with densityGPerMl" });
      }
    }),
]);
export type ComponentForm = z.output<typeof formSchema>;

/** One chemical of the recipe (not the reaction solvent). */
export const componentSchema = z
  .strictObject({
    id: componentId,
    name: z.string().min(1).max(300),
    /** reagent (incl. the limiting reagent), catalyst (metal source), ligand, or additive. */
    role: z.enum(["reagent", "catalyst", "ligand", "additive"]),
    /** Molecular formula (mf-parser syntax); the molar mass is computed from it. */
    formula: z.string().min(1).max(300).optional(),
    /** Molar mass given directly (g/mol); wins over the formula when both are given. */
    molarMassGPerMol: z.number().gt(0).max(100000).optional(),
    /** SMILES; the plan verb turns it into `formula` (openchemlib) when no formula is given. */
    smiles: z.string().min(1).max(2000).optional(),
    casNumber: z.string().regex(/^\d{2,7}-\d{2}-\d$/, "must be a CAS number such as 108-86-1").optional(),
    form: formSchema,
    /** Equivalents relative to the limiting reagent (reagents, additives). */
    equivalents: z.number().gt(0).max(1000).optional(),
    /** Catalyst loading: mol % of metal relative to the limiting reagent. */
    loadingMolPercent: z.number().gt(0).max(1000).optional(),
    /** Metal atoms per formula unit of the catalyst (2 for a dimeric precatalyst). */
    metalAtomsPerFormula: z.number().int().min(1).max(12).default(1),
    /** Ligand: mol ligand per mol metal of `catalyst`. */
    ligandToMetalRatio: z.number().gt(0).max(100).optional(),
    /** Ligand: the catalyst component it binds to (default: the only catalyst). */
    catalyst: componentId.optional(),
    /** Solubility in its stock solvent at room temperature (mg of pure compound per mL). */
    solubilityMgPerMl: z.number().gt(0).max(100000).optional(),
    /** The solvent of the recipe in which its stock is made (default: the major solvent). */
    stockSolvent: z.string().min(1).optional(),
    /** auto: chosen by the planner; stock: in solution (stock or master mix); solid: weighed per vial; neat: liquid or solution as supplied. */
    dispense: z.enum(["auto", "stock", "solid", "neat"]).default("auto"),
    /** Never put into a master mix with other components. */
    addSeparately: z.boolean().default(false),
    /** Position in the order of addition (lower first); default by kind, then recipe order. */
    addOrder: z.number().int().min(0).max(1000).optional(),
    /** Gas released per mol of this component (mol/mol), for the sealed-vessel pressure. */
    gasReleasedMolPerMol: z.number().min(0).max(100).optional(),
    hazards: componentHazardsSchema,
    chemicalId: chemicalId.optional(),
  })
  .superRefine((c, ctx) => {
    if (c.formula === undefined && c.molarMassGPerMol === undefined) {
      if (c.smiles !== undefined) {
        ctx.addIssue({
          code: "custom",
          path: ["smiles"],
          message: "SMILES must be turned into a formula first (the plan verb does this; in code call resolvePlanSmiles)",
        });
      } else ctx.addIssue({ code: "custom", path: ["formula"], message: "give formula, molarMassGPerMol or smiles" });
    }
    if (c.role === "catalyst" && c.loadingMolPercent === undefined) {
      ctx.addIssue({ code: "custom", path: ["loadingMolPercent"], message: "a catalyst needs loadingMolPercent (mol % of metal)" });
    }
    if (c.role === "ligand" && c.ligandToMetalRatio === undefined) {
      ctx.addIssue({ code: "custom", path: ["ligandToMetalRatio"], message: "a ligand needs ligandToMetalRatio" });
    }
    if (c.dispense === "solid" && c.form.state !== "solid") {
      ctx.addIssue({ code: "custom", path: ["dispense"], message: "only a solid can be dispensed as a solid" });
    }
    if (c.dispense === "neat" && c.form.state === "solid") {
      ctx.addIssue({ code: "custom", path: ["dispense"], message: "a solid cannot be dispensed neat; use solid or stock" });
    }
  });
export type Component = z.output<typeof componentSchema>;

/** One solvent of the reaction's solvent system. */
export const solventSchema = z.strictObject({
  /** A name or CAS number known to the solvent records (lib/hazards), e.g. "1,4-dioxane". */
  name: z.string().min(1).max(200),
  /** Volume fraction in the solvent system (fractions sum to 1). */
  volumeFraction: z.number().min(0).max(1),
  /** Defaults: water is protic and aqueous; common alcohols are protic. */
  protic: hazardFlagFields.protic,
  aqueous: hazardFlagFields.aqueous,
  ghs: hazardFlagFields.ghs,
  peroxideClass: hazardFlagFields.peroxideClass,
  ...containerDateFields,
  chemicalId: chemicalId.optional(),
});
export type Solvent = z.output<typeof solventSchema>;

export const recipeSchema = z
  .strictObject({
    /** Id of the limiting reagent (a component with role "reagent"). */
    limitingReagent: componentId,
    /** Limiting reagent per vial (mmol). */
    scaleMmol: z.number().gt(0).max(10000),
    /** Concentration of the limiting reagent in the final volume (mol/L). */
    concentrationM: z.number().gt(0).max(100).optional(),
    /** Or the final liquid volume per vial (µL). */
    finalVolumeUl: z.number().gt(0).max(1e7).optional(),
    components: z.array(componentSchema).min(1),
    solvents: z.array(solventSchema).min(1),
    /** Process values used when no factor drives them. */
    temperatureC: z.number().min(-273.15).max(1000).default(25),
    timeH: z.number().gt(0).max(10000).optional(),
    stirringRpm: z.number().min(0).max(10000).optional(),
    /** Declared by the chemist for the peroxide rule. */
    concentratesOrHeatsToDryness: z.boolean().default(false),
  })
  .superRefine((r, ctx) => {
    if ((r.concentrationM === undefined) === (r.finalVolumeUl === undefined)) {
      ctx.addIssue({ code: "custom", path: ["concentrationM"], message: "give exactly one of concentrationM or finalVolumeUl" });
    }
    const ids = new Map<string, number>();
    r.components.forEach((c, i) => {
      if (ids.has(c.id)) ctx.addIssue({ code: "custom", path: ["components", i, "id"], message: `duplicates component ${ids.get(c.id)}` });
      else ids.set(c.id, i);
    });
    const limiting = r.components.find((c) => c.id === r.limitingReagent);
    if (!limiting) ctx.addIssue({ code: "custom", path: ["limitingReagent"], message: "names no component of the recipe" });
    else if (limiting.role !== "reagent") ctx.addIssue({ code: "custom", path: ["limitingReagent"], message: "must be a component with role reagent" });
    const catalysts = r.components.filter((c) => c.role === "catalyst");
    r.components.forEach((c, i) => {
      if (c.role === "reagent" && c.id !== r.limitingReagent && c.equivalents === undefined) {
        ctx.addIssue({ code: "custom", path: ["components", i, "equivalents"], message: "a reagent other than the limiting one needs equivalents" });
      }
      if (c.role === "additive" && c.equivalents === undefined) {
        ctx.addIssue({ code: "custom", path: ["components", i, "equivalents"], message: "an additive needs equivalents" });
      }
      if (c.role === "ligand") {
        const cat = c.catalyst ? catalysts.find((k) => k.id === c.catalyst) : catalysts.length === 1 ? catalysts[0] : undefined;
        if (!cat) {
          ctx.addIssue({
            code: "custom",
            path: ["components", i, "catalyst"],
            message: c.catalyst ? "names no catalyst of the recipe" : "name the catalyst this ligand binds to",
          });
        }
      }
      if (c.stockSolvent !== undefined && !r.solvents.some((s) => s.name === c.stockSolvent)) {
        ctx.addIssue({ code: "custom", path: ["components", i, "stockSolvent"], message: "names no solvent of the recipe" });
      }
    });
    const names = new Set<string>();
    r.solvents.forEach((s, i) => {
      if (names.has(s.name)) ctx.addIssue({ code: "custom", path: ["solvents", i, "name"], message: "duplicate solvent" });
      names.add(s.name);
    });
    const sum = r.solvents.reduce((a, s) => a + s.volumeFraction, 0);
    if (Math.abs(sum - 1) > 1e-6) {
      ctx.addIssue({ code: "custom", path: ["solvents"], message: `volume fractions must sum to 1 (they sum to ${sum})` });
    }
  });
export type Recipe = z.output<typeof recipeSchema>;

/** What a factor changes. */
export const bindingSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("temperature") }),
  z.strictObject({ kind: z.literal("time") }),
  z.strictObject({ kind: z.literal("stirring") }),
  z.strictObject({ kind: z.literal("equivalents"), component: componentId }),
  z.strictObject({ kind: z.literal("loading"), component: componentId }),
  z.strictObject({ kind: z.literal("ligand-ratio"), component: componentId }),
  z.strictObject({
    kind: z.literal("concentration"),
    /** scale: mmol per vial fixed, the volume follows; volume: final volume fixed, the scale follows. */
    hold: z.enum(["scale", "volume"]).default("scale"),
  }),
  z.strictObject({ kind: z.literal("solvent-fraction"), solvent: z.string().min(1) }),
]);
export type Binding = z.output<typeof bindingSchema>;

/** A factor of the design engine plus what it drives. */
export const planFactorSchema = factorSchema.safeExtend({ binding: bindingSchema });
export type PlanFactor = z.output<typeof planFactorSchema>;

/** A run of a design already generated (the `design` verb's output rows). */
export const designRunSchema = z.strictObject({
  standardOrder: z.number().int().min(1),
  runOrder: z.number().int().min(1).optional(),
  /** The run's kind in its design: factorial, axial, center or optimal (or a kind of the caller's own). */
  kind: z.string().min(1).max(40).default("factorial"),
  /** The old name of `kind`: refused with a message that says so. */
  pointType: z.never({ error: "was renamed kind (factorial, axial, center or optimal)" }).optional(),
  coded: z.record(z.string(), z.number().finite()).optional(),
  natural: z.record(z.string(), z.number().finite()).optional(),
  block: z.union([z.number(), z.string()]).optional(),
});
export type DesignRun = z.output<typeof designRunSchema>;

/**
 * The design section: the `design` verb's input without `factors`; `runs` is either
 * the d-optimal run count or the runs of a design already generated.
 */
export const planDesignSchema = z
  .looseObject({
    design: z.string().min(1).optional(),
    runs: z
      .union([z.number(), z.array(z.unknown())])
      .transform((v, ctx): number | DesignRun[] => refineWith(v, typeof v === "number" ? z.number().int().min(1) : z.array(designRunSchema).min(1), ctx))
      .optional(),
  })
  .superRefine((d, ctx) => {
    if (d.design === undefined && !Array.isArray(d.runs)) {
      ctx.addIssue({ code: "custom", path: ["design"], message: "give the design type, or the generated runs" });
    }
  });
export type PlanDesign = z.output<typeof planDesignSchema>;

/** Liquid-handling and weighing limits of the lab (common practice; docs/sources.md). */
export const dispensingSchema = z
  .strictObject({
    /** Smallest volume dispensed (µL): practical minimum for air-displacement pipettes, 5–10 µL [CP]. */
    minPipetteVolumeUl: z.number().gt(0).max(10000).default(10),
    /** Extra prepared beyond what the vials take (%), +10 % [CP]. */
    overagePercent: z.number().min(0).max(200).default(10),
    /** Liquid left in each stock container that cannot be drawn (µL) [CP]. */
    deadVolumeUl: z.number().min(0).max(100000).default(50),
    /** Lab's minimum weighing mass (mg): USP general chapter ⟨41⟩ Balances (minimum weight for 0.10 % accuracy) for a 4-place balance ≈ 82 mg (from memory). */
    minWeighMassMg: z.number().min(0).max(100000).default(82),
    /** Largest stock that will be made up (mL), e.g. the largest volumetric flask at hand. */
    maxStockVolumeMl: z.number().gt(0).max(10000).default(25),
    /** Fraction of each solvent's volume that stocks may use in the most crowded vial; the rest is top-up. */
    stockFillFraction: z.number().gt(0).max(1).default(0.8),
  })
  .prefault({});
export type Dispensing = z.output<typeof dispensingSchema>;

export const planDocumentSchema = z
  .strictObject({
    schemaVersion: z.literal(1).default(1),
    name: z.string().max(300).optional(),
    recipe: recipeSchema,
    factors: z.array(planFactorSchema).default([]),
    design: planDesignSchema,
    /** A vessel type, or the id of one of the default vessel types. */
    vessel: z
      .union([z.string().min(1), z.record(z.string(), z.unknown())])
      .transform((v, ctx): string | VesselType => (typeof v === "string" ? v : refineWith(v, vesselTypeSchema, ctx))),
    thresholds: labThresholdsSchema,
    equipment: equipmentSchema,
    /** The heating or cooling block the runs sit in (optional; `equipment` holds its temperature limits). */
    block: blockSchema.optional(),
    dispensing: dispensingSchema,
    /** ISO date used for container ages in the cautions (default today). */
    now: isoDateSchema.optional(),
  })
  .superRefine((doc, ctx) => {
    const names = new Map<string, number>();
    const ids = new Set(doc.recipe.components.map((c) => c.id));
    const drivenOnce = new Map<string, number>();
    doc.factors.forEach((f, i) => {
      if (names.has(f.name)) ctx.addIssue({ code: "custom", path: ["factors", i, "name"], message: `duplicates factor ${names.get(f.name)}` });
      names.set(f.name, i);
      const b = f.binding;
      const target =
        b.kind === "equivalents" || b.kind === "loading" || b.kind === "ligand-ratio"
          ? `${b.kind}:${b.component}`
          : b.kind === "solvent-fraction"
            ? `solvent:${b.solvent}`
            : b.kind;
      if (drivenOnce.has(target)) {
        ctx.addIssue({ code: "custom", path: ["factors", i, "binding"], message: `drives the same quantity as factor ${drivenOnce.get(target)}` });
      }
      drivenOnce.set(target, i);
      if (b.kind === "equivalents" || b.kind === "loading" || b.kind === "ligand-ratio") {
        const comp = doc.recipe.components.find((c) => c.id === b.component);
        if (!ids.has(b.component) || !comp) {
          ctx.addIssue({ code: "custom", path: ["factors", i, "binding", "component"], message: "names no component of the recipe" });
        } else {
          const want = b.kind === "equivalents" ? ["reagent", "additive"] : b.kind === "loading" ? ["catalyst"] : ["ligand"];
          if (!want.includes(comp.role)) {
            ctx.addIssue({
              code: "custom",
              path: ["factors", i, "binding", "component"],
              message: `a ${b.kind} factor needs a component with role ${want.join(" or ")}`,
            });
          }
          if (b.kind === "equivalents" && comp.id === doc.recipe.limitingReagent) {
            ctx.addIssue({
              code: "custom",
              path: ["factors", i, "binding", "component"],
              message: "the limiting reagent is 1 equivalent by definition; vary the scale through concentration instead",
            });
          }
        }
      }
      if (b.kind === "solvent-fraction") {
        if (!doc.recipe.solvents.some((s) => s.name === b.solvent)) {
          ctx.addIssue({ code: "custom", path: ["factors", i, "binding", "solvent"], message: "names no solvent of the recipe" });
        } else if (doc.recipe.solvents.length < 2) {
          ctx.addIssue({ code: "custom", path: ["factors", i, "binding", "solvent"], message: "a co-solvent fraction needs at least two solvents" });
        }
      }
      if (b.kind === "concentration" && b.hold === "volume" && doc.recipe.finalVolumeUl === undefined && doc.recipe.concentrationM === undefined) {
        ctx.addIssue({ code: "custom", path: ["factors", i, "binding", "hold"], message: "needs the recipe's final volume or concentration" });
      }
    });
  });

export type PlanDocument = z.output<typeof planDocumentSchema>;
export type PlanDocumentInput = z.input<typeof planDocumentSchema>;
