/**
 * Lines that share one free amplitude in a fit: a doublet whose ratio atomic physics fixes
 * (TIED_LINES) is one group when both members are present; every other line is its own group.
 */
import { TIED_LINES } from './class-templates.js';
import type { ProfileLine } from './templates.js';

export interface LineGroupMember {
  /** Index of the line's group (0 … nGroups−1). */
  group: number;
  /** The line's strength relative to its group's amplitude. */
  ratio: number;
}

export function lineGroups(lines: readonly ProfileLine[]): { members: LineGroupMember[]; nGroups: number } {
  const groupOf = new Map<string, number>();
  const members: LineGroupMember[] = [];
  for (const l of lines) {
    const tie = TIED_LINES[l.id];
    const key = tie && lines.some((o) => o.id === tie.partner) ? tie.partner : l.id;
    if (!groupOf.has(key)) groupOf.set(key, groupOf.size);
    members.push({ group: groupOf.get(key)!, ratio: key === l.id ? 1 : tie.ratio });
  }
  return { members, nGroups: groupOf.size };
}
