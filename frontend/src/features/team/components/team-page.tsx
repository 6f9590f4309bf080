export function TeamPage() {
  return null;
}
