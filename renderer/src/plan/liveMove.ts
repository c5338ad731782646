/**
 * What a drag on the map would make of the project at its current position, for live
 * re-ranking (Planning.liveMove): the project is not edited until the drag ends.
 */
import type { KeepOut, LonLat, Project } from '../../../core/project/schema.ts';

export type DragMove =
  | { kind: 'support'; id: string; to: LonLat }
  | { kind: 'station'; to: LonLat }
  | { kind: 'keepOut'; id: string; geometry: KeepOut['geometry'] }
  | { kind: 'boundary'; corners: LonLat[] };

/** The project with the dragged thing where the drag has it now. */
export function withMove(p: Project, m: DragMove): Project {
  switch (m.kind) {
    case 'support':
      return { ...p, supports: p.supports.map((s) => (s.id === m.id ? { ...s, position: m.to } : s)) };
    case 'station':
      return { ...p, station: m.to };
    case 'keepOut':
      return { ...p, keepOuts: p.keepOuts.map((k) => (k.id === m.id ? { ...k, geometry: m.geometry } : k)) };
    case 'boundary': {
      const ring = [...m.corners, m.corners[0]!];
      return { ...p, boundary: { type: 'Polygon', coordinates: [ring] } };
    }
  }
}
