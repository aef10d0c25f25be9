import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";

export default function SettingsNotFound() {
  return (
    <>
      <PageHeader title="Nothing to show here" description="This settings page doesn't exist, or your role can't open it." />
      <Link href="/stock" className="btn-quiet">Go to stock</Link>
    </>
  );
}
