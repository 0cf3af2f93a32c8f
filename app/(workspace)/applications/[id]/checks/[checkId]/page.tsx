import { SavedCheck, type SavedCheckView } from "@/components/checks/saved-check";
import { loadCheckForPage } from "./load-check";

export const metadata = { title: "Deflection check" };

// Shows the stored result only: opening a saved check never re-computes it.
export default async function SavedCheckPage({ params }: { params: Promise<{ id: string; checkId: string }> }) {
  const view = await loadCheckForPage(params);
  return <SavedCheck view={JSON.parse(JSON.stringify(view)) as SavedCheckView} />;
}
