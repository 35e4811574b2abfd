"use client";
/**
 * The tabs under the schematic: findings, parts, nets and waveforms, measurements, what-if, the
 * record, photos, comments and history. Only the chosen one is drawn, so the page is no longer
 * than what is being read; the choice lives in the address's #fragment, so a link can open one.
 */
import { useEffect, useState } from "react";
import css from "../entry.module.css";

export const TABS = [
  ["findings", "Findings"],
  ["parts", "Parts"],
  ["nets", "Nets and waveforms"],
  ["measurements", "Measurements"],
  ["what-if", "What-if"],
  ["record", "Record"],
  ["photos", "Photos"],
  ["comments", "Comments"],
  ["history", "History"],
] as const;

export type TabId = (typeof TABS)[number][0];

function isTab(x: string): x is TabId {
  return TABS.some(([id]) => id === x);
}

/** The chosen tab, read from and written to the address's fragment. */
export function useTab(): [TabId, (t: TabId) => void] {
  const [tab, setTab] = useState<TabId>("findings");
  useEffect(() => {
    const read = () => {
      const h = window.location.hash.slice(1);
      if (isTab(h)) setTab(h);
    };
    read();
    window.addEventListener("hashchange", read);
    return () => window.removeEventListener("hashchange", read);
  }, []);
  const choose = (t: TabId) => {
    setTab(t);
    window.history.replaceState(null, "", `#${t}`);
  };
  return [tab, choose];
}

/** The tab bar; `counts` adds a number to a tab's name ("Findings (3)"). */
export function SectionTabs({
  tab,
  onTab,
  counts,
}: {
  tab: TabId;
  onTab: (t: TabId) => void;
  counts: Partial<Record<TabId, number>>;
}) {
  return (
    <div className={css.sectionTabs} role="tablist" aria-label="entry sections">
      {TABS.map(([id, label]) => (
        <button
          key={id}
          type="button"
          role="tab"
          id={`tab-${id}`}
          aria-selected={tab === id}
          aria-controls="entry-section"
          data-tab={id}
          onClick={() => onTab(id)}
        >
          {label}
          {counts[id] !== undefined ? ` (${counts[id]})` : ""}
        </button>
      ))}
    </div>
  );
}
