export function OutboxPage() {
  return null;
}
