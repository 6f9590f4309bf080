import { abilityFromPackedRules, type AppAbility, type PackedRules } from '@gyre/shared';
import { useAbility } from '@casl/react';

export type { AppAbility };

/**
 * The client's copy of the server's rules, used only to hide what the user cannot do;
 * the server checks every request again.
 */
export function abilityFromRules(rules: PackedRules): AppAbility {
  return abilityFromPackedRules(rules);
}

export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}
