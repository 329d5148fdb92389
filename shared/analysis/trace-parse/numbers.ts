// One field of a text file → a number, with an optional unit written after it ("12.5ns", "3,2 mV").

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/
const WITH_UNIT = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-zµμ]{1,4})$/

export interface ParsedField {
  value: number
  unit: string | null
}

/** Strips one pair of surrounding quotes, as spreadsheet exports write them. */
export function unquote(field: string): string {
  const f = field.trim()
  if (f.length >= 2 && ((f[0] === '"' && f[f.length - 1] === '"') || (f[0] === "'" && f[f.length - 1] === "'"))) return f.slice(1, -1).trim()
  return f
}

/** The number in `field`, or null when it is not one. With decimalComma, "1,5" is 1.5 and "1.5" is not a number. */
export function parseField(field: string, decimalComma: boolean): ParsedField | null {
  let f = unquote(field)
  if (f.length === 0) return null
  if (decimalComma) {
    if (f.includes('.')) return null
    f = f.replace(',', '.')
  }
  if (NUMBER.test(f)) return { value: Number(f), unit: null }
  const m = WITH_UNIT.exec(f)
  if (m) return { value: Number(m[1]), unit: m[2] }
  return null
}
