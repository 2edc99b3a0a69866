// The alert settings screen's choices per kind and the words that explain them; pure so the form stays small.
import { ROLE_LABELS, type Role } from '../../../../shared/permissions';
import {
  ALERT_KIND_LABELS,
  ALERT_KINDS,
  MY_SITES_DAYS,
  type AlertKind,
  type AlertScope,
  type PutSubscriptionsInput,
  type SubscriptionsDto,
} from '../../../../shared/schemas/alerts';

export const keyOf = (siteId: number, kind: AlertKind) => `${siteId}:${kind}`;

export type Choices = {
  scopes: Record<AlertKind, AlertScope>;
  /** Ticked site boxes of kinds that follow chosen sites or the default; "all sites" kinds keep theirs underneath. */
  ticked: Set<string>;
};

export function initialChoices(data: SubscriptionsDto): Choices {
  const scopes = Object.fromEntries(data.kinds.map((k) => [k.kind, k.scope])) as Record<AlertKind, AlertScope>;
  const ticked = new Set(
    data.subscriptions.filter((s) => scopes[s.kind] !== 'all_sites').map((s) => keyOf(s.siteId, s.kind)),
  );
  return { scopes, ticked };
}

/** The sites the role's default reaches for this kind. */
export function defaultSiteIds(data: SubscriptionsDto, kind: AlertKind): number[] {
  const reach = data.kinds.find((k) => k.kind === kind)?.defaultReach;
  if (reach === 'all_sites') return data.sites.map((s) => s.id);
  if (reach === 'my_sites') return data.mySiteIds;
  return [];
}

export function toggleSite(c: Choices, siteId: number, kind: AlertKind): Choices {
  const ticked = new Set(c.ticked);
  if (!ticked.delete(keyOf(siteId, kind))) ticked.add(keyOf(siteId, kind));
  return { scopes: { ...c.scopes, [kind]: 'sites' }, ticked };
}

export function setAllSites(c: Choices, kind: AlertKind, on: boolean): Choices {
  return { ...c, scopes: { ...c.scopes, [kind]: on ? 'all_sites' : 'sites' } };
}

export function backToDefault(c: Choices, data: SubscriptionsDto, kind: AlertKind): Choices {
  const ticked = new Set([...c.ticked].filter((k) => !k.endsWith(`:${kind}`)));
  for (const siteId of defaultSiteIds(data, kind)) ticked.add(keyOf(siteId, kind));
  return { scopes: { ...c.scopes, [kind]: 'default' }, ticked };
}

export function toInput(c: Choices): PutSubscriptionsInput {
  const subscriptions = [...c.ticked]
    .map((k) => {
      const [siteId, kind] = k.split(':');
      return { siteId: Number(siteId), kind: kind as AlertKind };
    })
    .filter((s) => c.scopes[s.kind] === 'sites');
  return {
    subscriptions,
    allSites: ALERT_KINDS.filter((k) => c.scopes[k] === 'all_sites'),
    useDefaults: ALERT_KINDS.filter((k) => c.scopes[k] === 'default'),
  };
}

const quoted = (kind: AlertKind) => `“${ALERT_KIND_LABELS[kind].title}”`;

function list(words: string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** "As a fleet engineer you get … for your sites unless you change it." */
export function defaultSentence(data: SubscriptionsDto): string {
  const role = ROLE_LABELS[data.role as Role].toLowerCase();
  const as = `As ${/^[aeiou]/.test(role) ? 'an' : 'a'} ${role}`;
  const reachOf = (reach: 'all_sites' | 'my_sites') => {
    const kinds = data.kinds.filter((k) => k.defaultReach === reach);
    if (kinds.length > 0 && kinds.length === data.kinds.length) return ['every alert below'];
    return kinds.map((k) => quoted(k.kind));
  };
  const parts = [
    reachOf('my_sites').length ? `${list(reachOf('my_sites'))} for your sites` : null,
    reachOf('all_sites').length ? `${list(reachOf('all_sites'))} for every site` : null,
  ].filter((p): p is string => p != null);
  if (parts.length === 0) return `${as} you get no alert mails unless you choose some below.`;
  return `${as} you get ${parts.join(', and ')} unless you change it.`;
}

/** Which sites "your sites" are, in words. */
export function mySitesSentence(data: SubscriptionsDto): string | null {
  if (!data.kinds.some((k) => k.defaultReach === 'my_sites')) return null;
  const names = data.sites.filter((s) => data.mySiteIds.includes(s.id)).map((s) => s.name);
  if (names.length === 0) {
    return `Your sites are the ones where you recorded a visit in the last ${MY_SITES_DAYS} days — none yet, so these defaults reach no site for now. Tick sites or choose “All sites” to hear sooner.`;
  }
  const shown = names.length > 6 ? [...names.slice(0, 5), `${names.length - 5} more`] : names;
  return `Your sites are the ones where you recorded a visit in the last ${MY_SITES_DAYS} days: ${list(shown)}.`;
}

/** One line under each kind: what reaches you now. */
export function scopeWords(c: Choices, data: SubscriptionsDto, kind: AlertKind): string {
  const scope = c.scopes[kind];
  if (scope === 'all_sites') return 'Every site, also sites added later.';
  const n = [...c.ticked].filter((k) => k.endsWith(`:${kind}`)).length;
  const sites = `${n} ${n === 1 ? 'site' : 'sites'}`;
  if (scope === 'sites') return n === 0 ? 'Off: no sites chosen.' : `${sites} you chose.`;
  const reach = data.kinds.find((k) => k.kind === kind)?.defaultReach;
  if (reach === 'all_sites') return 'Your default: every site.';
  if (reach === 'my_sites') return `Your default: your sites (${n === 0 ? 'none yet' : sites}).`;
  return 'Off: not a default for your role.';
}
