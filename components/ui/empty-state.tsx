// A calm panel that says what is (not yet) here and what to do next.
export function EmptyState({ title, children, icon }: { title: string; children?: React.ReactNode; icon?: React.ReactNode }) {
  return (
    <section className="panel flex flex-col items-start gap-3 px-6 py-8">
      {icon ? <div className="text-brine">{icon}</div> : null}
      <h2 className="text-xl font-semibold">{title}</h2>
      {children ? <div className="max-w-2xl space-y-2 text-brine">{children}</div> : null}
    </section>
  );
}
