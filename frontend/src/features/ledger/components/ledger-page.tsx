export function LedgerPage() {
  return null;
}
