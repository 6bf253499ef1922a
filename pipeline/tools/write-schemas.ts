/**
 * Writes the published JSON Schemas and defaults in configs/ and the settings table of the
 * README from the zod definitions (the single source). `npm run schemas`; a test checks the
 * committed files are current.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { schemaFiles, settingsTableMarkdown } from './schema-files.js';

const root = fileURLToPath(new URL('../../', import.meta.url));
for (const f of schemaFiles()) writeFileSync(root + f.path, f.text);
const readmePath = `${root}README.md`;
const readme = readFileSync(readmePath, 'utf8');
const start = '<!-- settings:start -->';
const end = '<!-- settings:end -->';
const i = readme.indexOf(start);
const j = readme.indexOf(end);
if (i >= 0 && j > i) writeFileSync(readmePath, `${readme.slice(0, i + start.length)}\n${settingsTableMarkdown()}${readme.slice(j)}`);
process.stdout.write('configs/ and the README settings table written\n');
