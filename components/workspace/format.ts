/** Number and time formats shared by the tables. */
export function fmtNs(ns: number | null | undefined): string {
  return ns == null ? "—" : `${ns.toFixed(ns < 10 ? 1 : 0)} ns`;
}

export function fmtMw(mw: number | null | undefined): string {
  if (mw == null) return "—";
  return mw < 0.01 ? `${(mw * 1000).toFixed(1)} µW` : `${mw.toFixed(mw < 10 ? 2 : 1)} mW`;
}

export function fmtInt(n: number | null | undefined): string {
  return n == null ? "—" : String(n);
}

export function fmtWhen(iso: string): string {
  const d = new Date(iso);
  const diff = (Date.now() - d.getTime()) / 1000;
  if (diff < 60) return "just now";
  if (diff < 3600) return `${Math.floor(diff / 60)} min ago`;
  if (diff < 86400) return `${Math.floor(diff / 3600)} h ago`;
  return d.toISOString().slice(0, 10);
}
