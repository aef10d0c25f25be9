// Page title with the current kitchen in it, as the design asks.
export function PageHeader({ title, kitchen, description, actions }: {
  title: string;
  kitchen?: { code: string; name: string } | null;
  description?: string;
  actions?: React.ReactNode;
}) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-[28px] font-semibold leading-tight">
          {title}
          {kitchen ? <span className="font-normal text-brine"> · {kitchen.name}</span> : null}
        </h1>
        {description ? <p className="mt-1 max-w-2xl text-brine">{description}</p> : null}
      </div>
      {actions ? <div className="flex gap-2">{actions}</div> : null}
    </header>
  );
}
