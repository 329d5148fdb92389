// Label, unit and help text of a form field, read from the `.describe()` text of the shared schema so the form
// and the API speak of a field the same way: "Interaction length L (m)" → label, unit "m", help = whole text.

/** Units the shared schemas put in parentheses; anything else in parentheses is part of the label. */
const KNOWN_UNITS = new Set(['m', 'ns', 'ps', 'W', 'MHz', 'GHz', 'dB/m', 'µm²', 'm/W', 'm²/W', 'nm', 'K', 'rad', 'm/s', 'm²', '1/(W m)', '1/m'])

export interface FieldText {
  label: string
  unit?: string
  hint: string
}

export function fieldText(description: string | undefined, fallbackLabel = ''): FieldText {
  if (!description) return { label: fallbackLabel, hint: '' }
  const firstClause = description.split(/;|\.\s/)[0]
  for (const m of firstClause.matchAll(/\(([^()]+)\)/g)) {
    if (KNOWN_UNITS.has(m[1].trim())) {
      const label = (firstClause.slice(0, m.index) + firstClause.slice(m.index + m[0].length)).replace(/\s+,/g, ',').replace(/\s+/g, ' ').trim()
      return { label, unit: m[1].trim(), hint: description }
    }
  }
  return { label: firstClause.trim(), hint: description }
}

/** Reads `.description` of a zod schema (zod 4 keeps it in the global registry). */
export const describeOf = (schema: { description?: string } | undefined): string | undefined => schema?.description
