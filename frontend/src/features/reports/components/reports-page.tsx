export function ReportsPage() {
  return null;
}
