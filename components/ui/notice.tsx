"use client";

// One polite confirmation line for a page ("Saved…", "Sent…"), set by any piece inside the
// provider and shown where the page puts <NoticeRegion>. The region is always in the page, so
// screen readers read out what appears in it.
import { createContext, useContext, useState, type ReactNode } from "react";
import { StatusRegion } from "./field";

const MessageContext = createContext<string | undefined>(undefined);
const SetterContext = createContext<(message: string | undefined) => void>(() => {});

export function NoticeProvider({ children }: { children: ReactNode }) {
  const [message, setMessage] = useState<string>();
  return (
    <SetterContext.Provider value={setMessage}>
      <MessageContext.Provider value={message}>{children}</MessageContext.Provider>
    </SetterContext.Provider>
  );
}

export function NoticeRegion({ className }: { className?: string }) {
  const message = useContext(MessageContext);
  return <StatusRegion className={message ? className : undefined}>{message}</StatusRegion>;
}

/** Shows a confirmation in the page's notice region; undefined clears it. */
export function useNotice(): (message: string | undefined) => void {
  return useContext(SetterContext);
}
