import { PageHeader } from './page-header';

/** A screen of the product map that is not built yet: says what it will hold. */
export function UpcomingScreen({ title, lead, plans }: { title: string; lead: string; plans: string[] }) {
  return (
    <div>
      <PageHeader title={title} lead={lead} />
      <div className="rounded-xl border border-dashed border-tide-200 bg-white/60 p-6">
        <p className="font-medium text-tide-800">Not open yet. This screen will let you:</p>
        <ul className="mt-2 list-disc space-y-1 pl-5 text-tide-800">
          {plans.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      </div>
    </div>
  );
}
