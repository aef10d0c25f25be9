import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";

// Inside the shell: a page that doesn't exist, or one the person's role can't open.
export default function AppNotFound() {
  return (
    <>
      <PageHeader title="Nothing to show here" description="This page doesn't exist, or your role can't open it." />
      <Link href="/stock" className="btn-quiet">Go to stock</Link>
    </>
  );
}
