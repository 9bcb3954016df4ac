import { redirect } from "next/navigation";

/** The inventory's landing page is the containers list. */
export default async function InventoryPage({ params }: { params: Promise<{ lab: string }> }) {
  redirect(`/labs/${(await params).lab}/inventory/containers`);
}
