/**
 * Writes the published JSON Schemas and defaults in configs/ and the generated tables of the
 * README (settings, cross-section columns) from their single definitions. `npm run schemas`;
 * a test checks that the committed files are current.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { columnsTableMarkdown, replaceBetween, schemaFiles, settingsTableMarkdown } from './schema-files.js';

const root = fileURLToPath(new URL('../../', import.meta.url));
for (const f of schemaFiles()) writeFileSync(root + f.path, f.text);
const readmePath = `${root}README.md`;
let readme = readFileSync(readmePath, 'utf8');
readme = replaceBetween(readme, 'settings', settingsTableMarkdown());
readme = replaceBetween(readme, 'columns', columnsTableMarkdown());
writeFileSync(readmePath, readme);
process.stdout.write('configs/ and the README tables written\n');
