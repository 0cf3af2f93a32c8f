import Link from "next/link";
import { notFound } from "next/navigation";
import { CheckWorkbench, type InitialModel, type WorkbenchView } from "@/components/checks/check-workbench";
import { db } from "@/db/client";
import { requirePageUser } from "@/lib/auth/session";
import { checkWorkbench, getCheck, readMemberModel } from "@/lib/checks/service";
import { AppError } from "@/lib/errors";

export const metadata = { title: "Deflection check" };

export default async function NewCheckPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id } = await params;
  const sp = await searchParams;
  if (!/^\d{1,15}$/.test(id)) notFound();
  const appId = Number(id);
  let ctx;
  try {
    ctx = await checkWorkbench(db(), user, appId);
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") notFound();
    if (e instanceof AppError && e.code === "forbidden") {
      return (
        <div className="max-w-xl">
          <h1 className="mb-2 text-2xl font-semibold">Deflection check</h1>
          <p className="text-sm">{e.message}</p>
          <Link href={`/applications/${appId}`} className="mt-3 inline-block text-accent underline-offset-2 hover:underline">
            Back to the application
          </Link>
        </div>
      );
    }
    throw e;
  }
  let initial: InitialModel | undefined;
  const from = typeof sp.from === "string" && /^\d{1,15}$/.test(sp.from) ? Number(sp.from) : null;
  const model = typeof sp.model === "string" && /^\d{1,15}$/.test(sp.model) ? Number(sp.model) : null;
  try {
    if (from) {
      const v = await getCheck(db(), user, appId, from);
      initial = {
        model: v.check.model,
        memberMark: v.check.memberMark,
        calcDocumentId: v.check.calcDocument?.kind === "calculations" ? v.check.calcDocument.id : null,
        calcPage: v.check.calcPage,
        sheetId: v.check.sheet?.id ?? null,
        from: `check #${v.check.id} (${v.check.memberMark})`,
      };
    } else if (model) {
      const m = await readMemberModel(db(), user, appId, model);
      initial = { model: m.model, from: `the member model ${m.name}` };
    }
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
  }
  return <CheckWorkbench ctx={JSON.parse(JSON.stringify(ctx)) as WorkbenchView} initial={initial} />;
}
