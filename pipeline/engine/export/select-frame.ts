import * as arrow from 'apache-arrow';

export type Frame = 'lab' | 'cm';

/** Cross-section columns of the other frame (`cross_section_lab_…`, `rutherford_lab_…` for --frame cm, and so on). */
const otherFrame = (frame: Frame) => new RegExp(`^(cross_section|rutherford)_${frame === 'lab' ? 'cm' : 'lab'}_`);

/**
 * The table with only one frame's cross sections (angles, the Jacobian and σ/σ_R, which are
 * frame-free or convert between frames, stay), or all columns when no frame is asked for.
 * Field and schema metadata are kept; the schema's `xsred.columns` dictionary lists the kept columns.
 */
export function selectFrame(table: arrow.Table, frame: Frame | undefined): arrow.Table {
  if (frame === undefined) return table;
  const drop = otherFrame(frame);
  const keep = table.schema.fields.filter((f) => !drop.test(f.name)).map((f) => f.name);
  const selected = table.select(keep);
  const meta = new Map(table.schema.metadata);
  const columns = meta.get('xsred.columns');
  if (columns !== undefined) {
    const kept = new Set(keep);
    meta.set('xsred.columns', JSON.stringify((JSON.parse(columns) as { name: string }[]).filter((c) => kept.has(c.name))));
  }
  meta.set('xsred.frame', frame);
  const schema = new arrow.Schema(selected.schema.fields, meta);
  return new arrow.Table(schema, selected.batches.map((b) => new arrow.RecordBatch(schema, b.data)));
}
