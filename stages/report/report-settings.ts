import { reportSettingsSchema, type ReportSettings } from '../../pipeline/core/config/series-schema.js';

export { reportSettingsSchema, type ReportSettings };

export const REPORT_DEFAULTS: ReportSettings = reportSettingsSchema.parse({});

/** The summary page's settings of a parsed series configuration (`report:` in series.yaml, defaults filled in). */
export function reportSettings(config: { report?: ReportSettings }): ReportSettings {
  return config.report ?? REPORT_DEFAULTS;
}
