/** The roles a person can hold in a lab (PRODUCT.md "People and roles"). */
export const ROLES = ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  chemist: "Chemist",
  safety_officer: "Safety officer",
  stockkeeper: "Stockkeeper",
  lab_admin: "Lab admin",
  viewer: "Viewer",
};
