"use strict";
/**
 * Demo data (invented; PRODUCT.md "Demo scenario"): the lab "Kestrel Bay Process Chemistry"
 * with one member per role, and a second lab with its own member to prove isolation.
 * Every demo account's password is "tareline-demo" (documented in README.md).
 */
const bcrypt = require("bcryptjs");

const LAB_KESTREL = "0b6f0c1e-4a51-4c8e-9d0a-000000000001";
const LAB_HARROW = "0b6f0c1e-4a51-4c8e-9d0a-000000000002";
const users = [
  { id: "6d1c2a10-0000-4000-8000-000000000001", email: "chemist@kestrelbay.example", name: "Ines Marlowe", lab: LAB_KESTREL, role: "chemist" },
  { id: "6d1c2a10-0000-4000-8000-000000000002", email: "safety@kestrelbay.example", name: "Tomas Ferreby", lab: LAB_KESTREL, role: "safety_officer" },
  { id: "6d1c2a10-0000-4000-8000-000000000003", email: "stock@kestrelbay.example", name: "Priya Oldcastle", lab: LAB_KESTREL, role: "stockkeeper" },
  { id: "6d1c2a10-0000-4000-8000-000000000004", email: "admin@kestrelbay.example", name: "Gareth Lune", lab: LAB_KESTREL, role: "lab_admin" },
  { id: "6d1c2a10-0000-4000-8000-000000000005", email: "viewer@kestrelbay.example", name: "Ada Quillon", lab: LAB_KESTREL, role: "viewer" },
  { id: "6d1c2a10-0000-4000-8000-000000000006", email: "analyst@harrowfen.example", name: "Noor Bellwether", lab: LAB_HARROW, role: "chemist" },
];

module.exports = {
  async up(queryInterface) {
    const now = new Date();
    await queryInterface.bulkInsert("labs", [
      { id: LAB_KESTREL, slug: "kestrel-bay", name: "Kestrel Bay Process Chemistry", settings: JSON.stringify({}), created_at: now, updated_at: now },
      { id: LAB_HARROW, slug: "harrow-fen", name: "Harrow Fen Analytical", settings: JSON.stringify({}), created_at: now, updated_at: now },
    ]);
    const hash = bcrypt.hashSync("tareline-demo", 10);
    await queryInterface.bulkInsert("users", users.map((u) => ({
      id: u.id, email: u.email, name: u.name, password_hash: hash, password_changed_at: now, created_at: now, updated_at: now,
    })));
    await queryInterface.bulkInsert("memberships", users.map((u, i) => ({
      id: `7e2d3b20-0000-4000-8000-00000000000${i + 1}`, lab_id: u.lab, user_id: u.id, role: u.role, created_at: now, updated_at: now,
    })));
    // The lab admin also belongs to the second lab as a viewer, so the lab switcher has something to switch.
    await queryInterface.bulkInsert("memberships", [{
      id: "7e2d3b20-0000-4000-8000-000000000010", lab_id: LAB_HARROW, user_id: users[3].id, role: "viewer", created_at: now, updated_at: now,
    }]);
  },
  async down(queryInterface) {
    await queryInterface.bulkDelete("memberships", { lab_id: [LAB_KESTREL, LAB_HARROW] });
    await queryInterface.bulkDelete("users", { id: users.map((u) => u.id) });
    await queryInterface.bulkDelete("labs", { id: [LAB_KESTREL, LAB_HARROW] });
  },
};
