/**
 * The GDAL_METADATA XML document (GDAL GTiff driver, "Metadata" section): dataset items, band
 * items (`sample` = 0-based band index) and band descriptions (`role="description"`).
 *
 * GDAL escapes item values twice (once as a value, once when serialising the XML) and unescapes
 * them twice when reading; names are escaped once. This writer follows that, so GDAL reads
 * back exactly the text given (checked against GDAL's own writer and reader in the tests).
 */
import type { RasterMetadata } from './profile.js';
import { ParameterError } from '../../errors.js';

/** XML's five predefined entities; the inner escaping GDAL applies to item values. */
function escapeEntities(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

/**
 * Escapes text for XML 1.0 character data and attribute values. Characters XML 1.0 forbids
 * (C0 controls other than tab, newline, carriage return) become U+FFFD; non-ASCII characters are
 * written as numeric character references so the TIFF ASCII field stays 7-bit.
 */
export function escapeXml(text: string): string {
  let out = '';
  for (const ch of text) {
    const c = ch.codePointAt(0) as number;
    if (ch === '&') out += '&amp;';
    else if (ch === '<') out += '&lt;';
    else if (ch === '>') out += '&gt;';
    else if (ch === '"') out += '&quot;';
    else if (ch === "'") out += '&apos;';
    else if (c === 0x9 || c === 0xa || c === 0xd) out += `&#${c};`;
    else if (c < 0x20 || c === 0xfffe || c === 0xffff || (c >= 0xd800 && c <= 0xdfff)) out += '&#65533;';
    else if (c > 0x7e) out += `&#${c};`;
    else out += ch;
  }
  return out;
}

/** The XML text, or undefined when there is nothing to write. */
export function gdalMetadataXml(md: RasterMetadata | undefined, count: number): string | undefined {
  if (md === undefined) return undefined;
  const lines: string[] = [];
  const item = (name: string, value: string, sample?: number, role?: string): void => {
    if (name === '') throw new ParameterError('a metadata item needs a non-empty name', 'metadata');
    const attrs = `name="${escapeXml(name)}"${sample === undefined ? '' : ` sample="${sample}"`}${role === undefined ? '' : ` role="${role}"`}`;
    lines.push(`  <Item ${attrs}>${escapeXml(escapeEntities(String(value)))}</Item>`);
  };
  for (const [k, v] of Object.entries(md.items ?? {})) item(k, v);
  if (md.bandDescriptions !== undefined && md.bandDescriptions.length > count) {
    throw new ParameterError(`${md.bandDescriptions.length} band descriptions for ${count} band(s)`, 'bandDescriptions');
  }
  if (md.bandItems !== undefined && md.bandItems.length > count) {
    throw new ParameterError(`${md.bandItems.length} sets of band items for ${count} band(s)`, 'bandItems');
  }
  for (let b = 0; b < count; b++) {
    const d = md.bandDescriptions?.[b];
    if (d !== undefined) item('DESCRIPTION', d, b, 'description');
    for (const [k, v] of Object.entries(md.bandItems?.[b] ?? {})) item(k, v, b);
  }
  if (lines.length === 0) return undefined;
  return `<GDALMetadata>\n${lines.join('\n')}\n</GDALMetadata>`;
}

/** GDAL_NODATA text: the value in decimal, "nan", "inf" or "-inf". */
export function gdalNodataText(nodata: number): string {
  if (Number.isNaN(nodata)) return 'nan';
  if (nodata === Infinity) return 'inf';
  if (nodata === -Infinity) return '-inf';
  return String(nodata);
}
