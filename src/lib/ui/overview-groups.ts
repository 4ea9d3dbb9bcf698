/** What grouping needs of a series (OutcomeSeries fits). */
export interface GroupableSeries {
  readonly key: string;
  /** "<where> · <measure label>", as seriesTitle writes it. */
  readonly title: string;
  readonly measure: { readonly code: string; readonly label: string; readonly panel?: { readonly label: string; readonly shortLabel: string } };
}

export interface OverviewRow<S extends GroupableSeries> {
  readonly series: S;
  /** The row's own words: the site for a measure's group, the index for a panel, the full title alone. */
  readonly label: string;
}

export interface OverviewGroup<S extends GroupableSeries> {
  readonly key: string;
  /** Shown on the group's header row; null for a group of one row (which has no header). */
  readonly label: string | null;
  readonly rows: readonly OverviewRow<S>[];
  /** Folded when the page first shows it, to keep the table within the row budget. */
  readonly folded: boolean;
}

const where = (title: string) => title.split(' · ')[0] ?? title;

/**
 * Groups a patient's series for the overview table: the sites of one measure together under the
 * measure's name, and the measures of one panel (the pendulum test's indices) under the panel's name,
 * in the series' own order. A group of one row keeps its full title and has no header. Then, while the
 * table would hold more than `budgetRows` rows (header rows count), the open group with the most rows
 * is folded to its header (on a tie, the later one). Cost: O(n · groups).
 */
export function overviewGroups<S extends GroupableSeries>(series: readonly S[], budgetRows: number): OverviewGroup<S>[] {
  const order: string[] = [];
  const members = new Map<string, S[]>();
  for (const s of series) {
    const key = s.measure.panel ? `panel:${s.measure.panel.label}` : `measure:${s.measure.code}`;
    if (!members.has(key)) {
      order.push(key);
      members.set(key, []);
    }
    members.get(key)!.push(s);
  }
  const groups = order.map((key) => {
    const list = members.get(key)!;
    const first = list[0]!;
    if (list.length === 1) return { key, label: null, rows: [{ series: first, label: first.title }], folded: false };
    const panel = first.measure.panel;
    if (!panel) return { key, label: first.measure.label, rows: list.map((s) => ({ series: s, label: where(s.title) })), folded: false };
    // A panel at one place reads "Pendulum test · Left knee …" with bare index names; at several, each row says where.
    const places = new Set(list.map((s) => where(s.title)));
    const onePlace = places.size === 1;
    return {
      key,
      label: onePlace ? `${panel.label} · ${where(first.title)}` : panel.label,
      rows: list.map((s) => ({ series: s, label: onePlace ? (s.measure.panel?.shortLabel ?? s.measure.label) : `${where(s.title)} · ${s.measure.panel?.shortLabel ?? s.measure.label}` })),
      folded: false,
    };
  });
  const size = (g: { label: string | null; rows: readonly unknown[]; folded: boolean }) => (g.label === null ? 0 : 1) + (g.folded ? 0 : g.rows.length);
  let total = groups.reduce((sum, g) => sum + size(g), 0);
  while (total > budgetRows) {
    let pick = -1;
    groups.forEach((g, i) => {
      if (g.label !== null && !g.folded && (pick < 0 || g.rows.length >= groups[pick]!.rows.length)) pick = i;
    });
    if (pick < 0) break;
    const g = groups[pick]!;
    total -= g.rows.length;
    groups[pick] = { ...g, folded: true };
  }
  return groups;
}
