"use strict";
/**
 * Demo inventory (PRODUCT.md "Demo scenario"; invented lots, barcodes and amounts) for
 * "Kestrel Bay Process Chemistry": about forty containers for Study A (Suzuki–Miyaura
 * coupling) and Study B (halogen–lithium exchange, borate quench), with a few near
 * expiry, one expired, one THF bottle (peroxide former) opened long ago, and
 * n-butyllithium short for Study B. Three containers in the second lab prove isolation.
 * Amounts are integer base units: µg for mass, nL for volume. Dates are relative to the
 * day the seed runs.
 */
const LAB = "0b6f0c1e-4a51-4c8e-9d0a-000000000001";
const HARROW = "0b6f0c1e-4a51-4c8e-9d0a-000000000002";
const STOCKKEEPER = "6d1c2a10-0000-4000-8000-000000000003";
const HARROW_USER = "6d1c2a10-0000-4000-8000-000000000006";

const id = (prefix, n) => `${prefix}-0000-4000-8000-${String(n).padStart(12, "0")}`;
const FACTOR = { "µg": 1n, mg: 1000n, g: 1000000n, kg: 1000000000n, "µL": 1000n, mL: 1000000n, L: 1000000000n };
const DIM = { "µg": "mass", mg: "mass", g: "mass", kg: "mass", "µL": "volume", mL: "volume", L: "volume" };
/** "12.5", "g" → 12500000n (exact). */
function base(value, unit) {
  const [int, frac = ""] = String(value).split(".");
  const scale = 10n ** BigInt(frac.length);
  return (BigInt(int + frac) * FACTOR[unit]) / scale;
}
function day(offset) {
  const d = new Date();
  d.setUTCHours(0, 0, 0, 0);
  d.setUTCDate(d.getUTCDate() + offset);
  return d.toISOString().slice(0, 10);
}

const locations = [
  [1, LAB, "Flammables cabinet F1"],
  [2, LAB, "Cold room (4 °C)"],
  [3, LAB, "Glovebox GB-2"],
  [4, LAB, "Shelf B3 (solids)"],
  [5, LAB, "Solvent store S1"],
  [6, LAB, "Acids cabinet A1"],
  [7, HARROW, "HF solvent cabinet"],
];

// [n, lab, name, cas, formula, molarMass, density, state, ghs, pyrophoric, waterReactive, peroxideClass, storage, lowStock [value, unit] | null]
const chemicals = [
  [1, LAB, "4-Bromoanisole", "104-92-7", "C7H7BrO", "187.0400", "1.4940", "liquid", ["H302", "H315", "H319"], false, false, null, null, ["20", "mL"]],
  [2, LAB, "Pyridin-3-ylboronic acid", "1692-25-7", "C5H6BNO2", "122.9200", null, "solid", ["H315", "H319", "H335"], false, false, null, "Keep dry; store cold.", ["5", "g"]],
  [3, LAB, "XPhos Pd G3", "1445085-55-1", "C46H62NO3PPdS", "846.4500", null, "solid", ["H315", "H319"], false, false, null, "Store under argon.", ["500", "mg"]],
  [4, LAB, "XPhos", "564483-18-7", "C33H49P", "476.7200", null, "solid", [], false, false, null, null, null],
  [5, LAB, "Potassium phosphate tribasic", "7778-53-2", "K3PO4", "212.2700", null, "solid", ["H315", "H319", "H335"], false, false, null, "Hygroscopic: keep the lid closed.", ["50", "g"]],
  [6, LAB, "1,4-Dioxane", "123-91-1", "C4H8O2", "88.1100", "1.0330", "liquid", ["H225", "H319", "H335", "H351", "EUH019", "EUH066"], false, false, "B", "Peroxide former: date on opening, test before distilling or heating to dryness.", ["500", "mL"]],
  [7, LAB, "Water, deionised", "7732-18-5", "H2O", "18.0150", "0.9970", "liquid", [], false, false, null, null, null],
  [8, LAB, "3-Bromoanisole", "2398-37-0", "C7H7BrO", "187.0400", "1.4770", "liquid", ["H302", "H315", "H319"], false, false, null, null, ["10", "mL"]],
  [9, LAB, "n-Butyllithium, 2.5 M in hexanes", "109-72-8", "C4H9Li", "64.0600", "0.6800", "solution", ["H225", "H250", "H260", "H304", "H314", "H336", "H361f", "H373", "H411", "EUH014"], true, true, null, "Pyrophoric: syringe or cannula under argon only; second person above the lab's volume limit.", ["50", "mL"]],
  [10, LAB, "Tetrahydrofuran, anhydrous", "109-99-9", "C4H8O", "72.1100", "0.8890", "liquid", ["H225", "H302", "H319", "H335", "H351", "EUH019"], false, false, "B", "Peroxide former; inhibitor-free grade: test every 12 months after opening.", ["1", "L"]],
  [11, LAB, "Triisopropyl borate", "5419-55-6", "C9H21BO3", "188.0700", "0.8150", "liquid", ["H225", "H319"], false, false, null, "Moisture sensitive.", ["25", "mL"]],
  [12, LAB, "Hydrochloric acid, 1 M", "7647-01-0", "HCl", "36.4600", "1.0160", "solution", ["H290", "H314", "H335"], false, false, null, null, null],
  [13, LAB, "Ammonium chloride", "12125-02-9", "NH4Cl", "53.4900", null, "solid", ["H302", "H319"], false, false, null, null, null],
  [14, LAB, "Dodecane (internal standard)", "112-40-3", "C12H26", "170.3400", "0.7500", "liquid", ["H304"], false, false, null, null, null],
  [15, LAB, "Magnesium sulfate, anhydrous", "7487-88-9", "MgSO4", "120.3700", null, "solid", [], false, false, null, null, null],
  [16, LAB, "Potassium carbonate", "584-08-7", "K2CO3", "138.2100", null, "solid", ["H302", "H315", "H319", "H335"], false, false, null, null, null],
  [17, HARROW, "Acetonitrile", "75-05-8", "C2H3N", "41.0500", "0.7860", "liquid", ["H225", "H302", "H312", "H319", "H332"], false, false, null, null, null],
  [18, HARROW, "Methanol", "67-56-1", "CH4O", "32.0400", "0.7920", "liquid", ["H225", "H301", "H311", "H331", "H370"], false, false, null, null, null],
  [19, HARROW, "Tetrahydrofuran", "109-99-9", "C4H8O", "72.1100", "0.8890", "liquid", ["H225", "H302", "H319", "H335", "H351", "EUH019"], false, false, "B", null, null],
];

// [n, chemical, location, barcode, lot, [value, unit], concentration, concUnit, solvent, purity, receivedDays, openedDays, expiresDays, status]
const containers = [
  // Study A: Suzuki–Miyaura
  [1, 1, 1, "KB-000101", "L2309-14", ["100", "mL"], null, null, null, "99.000", -220, -150, 500, "available"],
  [2, 1, 1, "KB-000102", "L2401-03", ["25", "mL"], null, null, null, "98.500", -90, -40, 12, "available"],
  [3, 1, 1, "KB-000103", "L2406-22", ["100", "mL"], null, null, null, "99.000", -30, null, 700, "available"],
  [4, 2, 2, "KB-000201", "BA-7781", ["10", "g"], null, null, null, "97.000", -120, -60, 240, "available"],
  [5, 2, 2, "KB-000202", "BA-7815", ["25", "g"], null, null, null, "97.000", -20, null, 600, "available"],
  [6, 2, 2, "KB-000203", "BA-7702", ["2.350", "g"], null, null, null, "96.000", -400, -300, -5, "available"],
  [7, 3, 3, "KB-000301", "PG3-0412", ["1", "g"], null, null, null, "98.000", -100, -70, 400, "available"],
  [8, 3, 3, "KB-000302", "PG3-0455", ["500", "mg"], null, null, null, "98.000", -15, null, 720, "available"],
  [9, 4, 3, "KB-000401", "XP-2291", ["5", "g"], null, null, null, "98.000", -200, -120, 300, "available"],
  [10, 4, 3, "KB-000402", "XP-2340", ["1", "g"], null, null, null, "98.000", -40, null, 20, "available"],
  [11, 5, 4, "KB-000501", "KP-5510", ["500", "g"], null, null, null, "98.000", -300, -200, 365, "available"],
  [12, 5, 4, "KB-000502", "KP-5604", ["250", "g"], null, null, null, "98.000", -60, -10, 900, "available"],
  [13, 5, 4, "KB-000503", "KP-5399", ["42.5", "g"], null, null, null, "97.000", -500, -450, 25, "available"],
  [14, 6, 5, "KB-000601", "DX-8802", ["1", "L"], null, null, null, "99.800", -250, -180, 300, "available"],
  [15, 6, 5, "KB-000602", "DX-8860", ["2.5", "L"], null, null, null, "99.800", -30, null, 700, "available"],
  [16, 6, 5, "KB-000603", "DX-8791", ["150", "mL"], null, null, null, "99.500", -420, -330, 60, "quarantined"],
  [17, 7, 5, "KB-000701", "DI-2611", ["4", "L"], null, null, null, null, -10, -5, null, "available"],
  [18, 7, 5, "KB-000702", "DI-2612", ["4", "L"], null, null, null, null, -10, null, null, "available"],
  [19, 16, 4, "KB-001601", "KC-3390", ["500", "g"], null, null, null, "99.000", -150, -100, 800, "available"],
  [20, 14, 1, "KB-001401", "DD-1177", ["100", "mL"], null, null, null, "99.000", -200, -150, 1000, "available"],
  [21, 15, 4, "KB-001501", "MS-0082", ["1", "kg"], null, null, null, "99.500", -300, -280, null, "available"],
  [22, 15, 4, "KB-001502", "MS-0091", ["500", "g"], null, null, null, "99.500", -30, null, null, "available"],
  // Study B: halogen–lithium exchange and borate quench
  [23, 8, 1, "KB-000801", "BA3-4410", ["50", "mL"], null, null, null, "98.000", -90, -60, 500, "available"],
  [24, 8, 1, "KB-000802", "BA3-4470", ["25", "mL"], null, null, null, "98.000", -14, null, 15, "available"],
  [25, 9, 3, "KB-000901", "BL-7719", ["8", "mL"], "2.500000", "M", "hexanes", null, -150, -120, 30, "available"],
  [26, 9, 3, "KB-000902", "BL-7650", ["3.2", "mL"], "2.500000", "M", "hexanes", null, -400, -380, -20, "quarantined"],
  [27, 10, 5, "KB-001001", "TH-5120", ["1", "L"], null, null, null, "99.900", -520, -430, 200, "available"],
  [28, 10, 5, "KB-001002", "TH-5301", ["2.5", "L"], null, null, null, "99.900", -25, null, 680, "available"],
  [29, 10, 5, "KB-001003", "TH-5288", ["500", "mL"], null, null, null, "99.900", -60, -20, 600, "available"],
  [30, 11, 1, "KB-001101", "TB-0938", ["100", "mL"], null, null, null, "98.000", -180, -90, 400, "available"],
  [31, 11, 1, "KB-001102", "TB-0961", ["25", "mL"], null, null, null, "98.000", -20, null, 9, "available"],
  [32, 12, 6, "KB-001201", "HC-1M-18", ["1", "L"], "1.000000", "M", "water", null, -100, -50, 500, "available"],
  [33, 12, 6, "KB-001202", "HC-1M-22", ["500", "mL"], "1.000000", "M", "water", null, -20, null, 700, "available"],
  [34, 13, 4, "KB-001301", "AC-6610", ["500", "g"], null, null, null, "99.500", -200, -180, 900, "available"],
  [35, 13, 4, "KB-001302", "AC-6702", ["1", "kg"], null, null, null, "99.500", -20, null, 1000, "available"],
  [36, 14, 1, "KB-001402", "DD-1203", ["25", "mL"], null, null, null, "99.000", -30, null, 1100, "available"],
  [37, 16, 4, "KB-001602", "KC-3402", ["1", "kg"], null, null, null, "99.000", -20, null, 900, "available"],
  [38, 3, 3, "KB-000303", "PG3-0318", ["120", "mg"], null, null, null, "97.000", -600, -500, -30, "available"],
  [39, 4, 3, "KB-000403", "XP-2201", ["0", "g"], null, null, null, "98.000", -700, -650, 100, "empty"],
  [40, 7, 5, "KB-000703", "DI-2540", ["1", "L"], null, null, null, null, -100, -90, null, "available"],
  // Harrow Fen Analytical (the second lab)
  [41, 17, 7, "HF-0001", "AN-901", ["2.5", "L"], null, null, null, "99.900", -50, -20, 700, "available"],
  [42, 18, 7, "HF-0002", "ME-114", ["2.5", "L"], null, null, null, "99.900", -50, null, 700, "available"],
  [43, 19, 7, "HF-0003", "TH-220", ["1", "L"], null, null, null, "99.900", -50, -30, 500, "available"],
];

const UNIT_OF = (u) => u;

module.exports = {
  async up(queryInterface) {
    const now = new Date();
    const stamps = { created_at: now, updated_at: now };
    await queryInterface.bulkInsert("locations", locations.map(([n, lab, name]) => ({ id: id("10c00000", n), lab_id: lab, name, notes: null, ...stamps })));
    await queryInterface.bulkInsert(
      "chemicals",
      chemicals.map(([n, lab, name, cas, formula, mm, density, state, ghs, pyro, water, perox, storage, low]) => ({
        id: id("c4e10000", n),
        lab_id: lab,
        name,
        synonyms: JSON.stringify([]),
        cas,
        formula,
        molar_mass: mm,
        density,
        physical_state: state,
        ghs_statements: JSON.stringify(ghs),
        pyrophoric: pyro,
        water_reactive: water,
        peroxide_class: perox,
        storage_notes: storage,
        low_stock_base: low ? base(low[0], low[1]).toString() : null,
        low_stock_dimension: low ? DIM[low[1]] : null,
        ...stamps,
      })),
    );
    const chemLab = new Map(chemicals.map((c) => [c[0], c[1]]));
    await queryInterface.bulkInsert(
      "containers",
      containers.map(([n, chem, loc, barcode, lot, [v, u], conc, cu, solvent, purity, rec, opened, exp, status]) => ({
        id: id("c0a10000", n),
        lab_id: chemLab.get(chem),
        chemical_id: id("c4e10000", chem),
        location_id: id("10c00000", loc),
        barcode,
        lot,
        dimension: DIM[u],
        amount_base: base(v, u).toString(),
        initial_base: base(v, u).toString(),
        display_unit: UNIT_OF(u),
        concentration: conc,
        concentration_unit: cu,
        solvent,
        purity_percent: purity,
        received_on: day(rec),
        opened_on: opened === null ? null : day(opened),
        expires_on: exp === null ? null : day(exp),
        peroxide_tested_on: null,
        status,
        ...stamps,
      })),
    );
    await queryInterface.bulkInsert(
      "stock_ledger",
      containers.map(([n, chem, , , , [v, u]]) => ({
        lab_id: chemLab.get(chem),
        container_id: id("c0a10000", n),
        reservation_id: null,
        kind: "received",
        delta_base: base(v, u).toString(),
        held_delta_base: "0",
        balance_base: base(v, u).toString(),
        reason: "Demo stock received",
        actor_user_id: chemLab.get(chem) === LAB ? STOCKKEEPER : HARROW_USER,
        created_at: now,
      })),
    );
    // A plan of Study A already holds some stock (plan_ref is text until plans exist).
    const held = [
      [1, 3, "demo-study-a-screen", ["6.2", "mL"]],
      [2, 5, "demo-study-a-screen", ["2.9", "g"]],
      [3, 7, "demo-study-a-screen", ["150", "mg"]],
      [4, 11, "demo-study-a-screen", ["60", "g"]],
    ];
    await queryInterface.bulkInsert(
      "reservations",
      held.map(([n, c, plan, [v, u]]) => ({
        id: id("4e5e0000", n), lab_id: LAB, container_id: id("c0a10000", c), plan_ref: plan, amount_base: base(v, u).toString(), consumed_base: null,
        status: "held", note: "Demo: Study A screening plan", reserved_by: STOCKKEEPER, closed_by: null, closed_at: null, ...stamps,
      })),
    );
    await queryInterface.bulkInsert(
      "stock_ledger",
      held.map(([n, c, plan, [v, u]]) => {
        const box = containers.find((x) => x[0] === c);
        return {
          lab_id: LAB, container_id: id("c0a10000", c), reservation_id: id("4e5e0000", n), kind: "reserved", delta_base: "0", held_delta_base: base(v, u).toString(),
          balance_base: base(box[5][0], box[5][1]).toString(), reason: `Reserved for plan ${plan}`, actor_user_id: STOCKKEEPER, created_at: now,
        };
      }),
    );
  },
  async down(queryInterface) {
    const labs = [LAB, HARROW];
    // The ledger refuses deletes by design; the demo's own rows are removed with the trigger paused.
    await queryInterface.sequelize.query("ALTER TABLE stock_ledger DISABLE TRIGGER stock_ledger_no_update");
    await queryInterface.bulkDelete("stock_ledger", { lab_id: labs });
    await queryInterface.sequelize.query("ALTER TABLE stock_ledger ENABLE TRIGGER stock_ledger_no_update");
    await queryInterface.bulkDelete("reservations", { lab_id: labs });
    await queryInterface.bulkDelete("containers", { lab_id: labs });
    await queryInterface.bulkDelete("safety_data_sheets", { lab_id: labs });
    await queryInterface.bulkDelete("chemicals", { lab_id: labs });
    await queryInterface.bulkDelete("locations", { lab_id: labs });
  },
};
