/**
 * Importing a lot boundary from a file: GeoJSON or KML (core/project/importBoundary.ts) or a
 * shapefile, zipped or loose (core/project/importShapefile.ts). A file with many parcels leaves a
 * choice open; the chosen parcel is written in one edit (never a partial lot), and then its
 * measures and what its attributes offer as the project's name and notes are shown.
 */
import {
  importBoundary,
  MAX_IMPORT_BYTES,
  type ImportProblem,
} from '../../../core/project/importBoundary.ts';
import { importShapefile, MAX_SHAPEFILE_BYTES, type Parcel } from '../../../core/project/importShapefile.ts';
import { parcelOffer } from '../../../core/project/lotMeasures.ts';
import type { Polygon } from '../../../core/project/schema.ts';
import type { ProjectState } from '../state/project.svelte.ts';

const SHAPEFILE_PARTS = /\.(zip|shp|dbf|prj|cpg|shx|sbn|sbx|xml)$/i;

export interface ParcelChoice {
  source: string;
  fields: string[];
  parcels: Parcel[];
}

export class LotImport {
  errors = $state.raw<ImportProblem[]>([]);
  warnings = $state.raw<string[]>([]);
  done = $state('');
  busy = $state(false);
  /** Open when a file held several parcels. */
  choice = $state.raw<ParcelChoice | null>(null);
  /** After an import: what the parcel's attributes offer. */
  offer = $state.raw<{ name: string | null; notes: string } | null>(null);
  imported = $state.raw<Polygon | null>(null);
  #doc: ProjectState;
  #fit: () => void;

  constructor(doc: ProjectState, fit: () => void) {
    this.#doc = doc;
    this.#fit = fit;
  }

  clear(): void {
    this.errors = [];
    this.warnings = [];
    this.done = '';
    this.choice = null;
    this.offer = null;
    this.imported = null;
  }

  async importFiles(files: File[]): Promise<void> {
    this.clear();
    if (files.length === 0) return;
    this.busy = true;
    try {
      if (files.some((f) => SHAPEFILE_PARTS.test(f.name))) await this.#shapefile(files);
      else await this.#text(files[0]!);
    } finally {
      this.busy = false;
    }
  }

  async #text(file: File): Promise<void> {
    if (file.size > MAX_IMPORT_BYTES) {
      this.errors = [
        {
          path: file.name,
          message: `is ${(file.size / 1e6).toFixed(1)} MB; at most ${MAX_IMPORT_BYTES / 1e6} MB`,
        },
      ];
      return;
    }
    const r = importBoundary(await file.text(), file.name);
    if (!r.ok) {
      this.errors = r.errors;
      return;
    }
    this.warnings = r.warnings;
    if (this.#apply(r.boundary, file.name, null))
      this.done = `Lot boundary imported from ${file.name} (${r.format === 'kml' ? 'KML' : 'GeoJSON'}, ${r.boundary.coordinates[0]!.length - 1} corners).`;
  }

  async #shapefile(files: File[]): Promise<void> {
    const total = files.reduce((s, f) => s + f.size, 0);
    const names = files.map((f) => f.name).join(', ');
    if (total > MAX_SHAPEFILE_BYTES) {
      this.errors = [
        {
          path: names,
          message: `are ${(total / 1e6).toFixed(1)} MB; at most ${MAX_SHAPEFILE_BYTES / 1e6} MB`,
        },
      ];
      return;
    }
    const inputs = await Promise.all(
      files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })),
    );
    const r = await importShapefile(inputs);
    if (!r.ok) {
      this.errors = r.errors;
      return;
    }
    this.warnings = [
      ...r.warnings,
      ...(r.skippedCount
        ? [
            `${r.skippedCount} record(s) are not usable lot boundaries and are left out`,
            ...r.skipped.map((p) => `${p.path}: ${p.message}`),
          ]
        : []),
    ];
    const source = files.length === 1 ? files[0]!.name : `${r.layer}.shp`;
    if (r.parcels.length === 1) this.choose(r.parcels[0]!, source);
    else this.choice = { source, fields: r.fields, parcels: r.parcels };
  }

  /** Use this parcel as the lot boundary (one edit). */
  choose(p: Parcel, source: string): void {
    this.choice = null;
    if (this.#apply(p.boundary, `${source} record ${p.record}`, p)) {
      this.warnings = [...this.warnings, ...p.warnings];
      this.offer = parcelOffer(p.attributes, source);
      this.done = `Lot boundary imported from ${source}, record ${p.record} (${p.boundary.coordinates[0]!.length - 1} corners).`;
    }
  }

  #apply(boundary: Polygon, source: string, parcel: Parcel | null): boolean {
    const ok = this.#doc.edit(`import lot boundary from ${source}`, (q) => ({ ...q, boundary }));
    if (!ok) {
      this.errors = [{ path: source, message: this.#doc.editError ?? 'the boundary was refused' }];
      return false;
    }
    this.imported = boundary;
    if (!parcel) this.offer = null;
    this.#fit();
    return true;
  }

  useName(): void {
    if (this.offer?.name && this.#doc.rename(this.offer.name)) this.offer = { ...this.offer, name: null };
  }

  useNotes(): void {
    const o = this.offer;
    if (!o || !o.notes) return;
    const current = this.#doc.project?.notes ?? '';
    const notes = (current ? `${current}\n\n${o.notes}` : o.notes).slice(0, 5000);
    if (this.#doc.setNotes(notes)) this.offer = { ...o, notes: '' };
  }
}
