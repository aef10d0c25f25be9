import { LogoMark, Wordmark } from "@/components/brand/logo-mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      <aside className="flex flex-col justify-between bg-smoke px-8 py-8 text-smoke-text md:w-[42%] md:px-12 md:py-12">
        <div className="flex items-center gap-3 text-smoke-text">
          <LogoMark className="h-10 w-10" />
          <Wordmark className="text-2xl" />
        </div>
        <div className="mt-10 hidden max-w-sm md:block">
          <p className="font-display text-3xl leading-snug text-white">Every hank, every lot, every kitchen.</p>
          <p className="mt-4 text-smoke-muted">
            Casings by calibre, cure by lot and date, spices by the gram: counted once, known everywhere.
          </p>
        </div>
        <p className="mt-10 hidden text-sm text-smoke-muted md:block">Dry-goods stock for sausage and charcuterie kitchens.</p>
      </aside>
      <main className="flex flex-1 items-start justify-center px-6 py-10 md:items-center">
        <div className="w-full max-w-md">{children}</div>
      </main>
    </div>
  );
}
