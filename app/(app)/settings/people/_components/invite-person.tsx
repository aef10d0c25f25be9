"use client";

import { useCallback, useState } from "react";
import { UserPlus } from "lucide-react";
import { useNotice } from "@/components/ui/notice";
import { SideSheet } from "@/components/ui/side-sheet";
import type { KitchenOption } from "./kitchen-choices";
import { InviteForm } from "./invite-form";

export function InvitePerson({ kitchens, companyName }: { kitchens: KitchenOption[]; companyName: string }) {
  const [open, setOpen] = useState(false);
  const setNotice = useNotice();
  const close = useCallback(() => setOpen(false), []);
  const sent = useCallback((message: string) => {
    setOpen(false);
    setNotice(message);
  }, [setNotice]);
  return (
    <>
      <button type="button" className="btn-primary" onClick={() => { setNotice(undefined); setOpen(true); }}>
        <UserPlus aria-hidden className="h-5 w-5" />
        Invite someone
      </button>
      <SideSheet open={open} onClose={close} title="Invite someone" description={`They get an e-mail to join ${companyName} and choose a password.`}>
        <InviteForm kitchens={kitchens} onSent={sent} onCancel={close} />
      </SideSheet>
    </>
  );
}
