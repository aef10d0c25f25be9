import Link from "next/link";
import { LogoMark, Wordmark } from "@/components/brand/logo-mark";

export default function NotFound() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-4 px-6 text-center">
      <div className="flex items-center gap-3 text-pepper">
        <LogoMark className="h-10 w-10" />
        <Wordmark className="text-2xl" />
      </div>
      <h1 className="text-3xl font-semibold">Nothing to show here</h1>
      <p className="max-w-md text-brine">This address doesn't lead to a page. Check the link, or start again from the beginning.</p>
      <Link href="/" className="btn-primary">Go to Hank &amp; Lot</Link>
    </main>
  );
}
