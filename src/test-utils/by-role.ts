// A small accessible-query helper: find elements the way assistive technology names them, so tests
// break when a control loses its role or label, not when its markup is rearranged.

const IMPLICIT: Record<string, string> = {
  button: 'button, [role="button"], input[type="button"], input[type="submit"]',
  link: 'a[href], [role="link"]',
  navigation: 'nav, [role="navigation"]',
  banner: 'header, [role="banner"]',
  main: 'main, [role="main"]',
  heading: 'h1, h2, h3, h4, h5, h6, [role="heading"]',
  alert: '[role="alert"]',
  table: 'table, [role="table"]',
  textbox: 'input:not([type]), input[type="text"], input[type="email"], input[type="password"], textarea',
}

export function accessibleName(el: Element): string {
  const label = el.getAttribute('aria-label')
  if (label) return label.trim()
  const by = el.getAttribute('aria-labelledby')
  if (by) {
    return by
      .split(/\s+/)
      .map((id) => el.ownerDocument.getElementById(id)?.textContent ?? '')
      .join(' ')
      .trim()
  }
  if (el instanceof HTMLInputElement && el.id) {
    const forLabel = el.ownerDocument.querySelector(`label[for="${el.id}"]`)
    if (forLabel) return (forLabel.textContent ?? '').trim()
  }
  return (el.textContent ?? '').replace(/\s+/g, ' ').trim()
}

function isHidden(el: Element): boolean {
  for (let e: Element | null = el; e; e = e.parentElement) {
    if (e.getAttribute('aria-hidden') === 'true' || (e as HTMLElement).hidden) return true
  }
  return false
}

export function queryAllByRole(root: ParentNode, role: string, name?: string | RegExp): Element[] {
  const selector = IMPLICIT[role] ?? `[role="${role}"]`
  return Array.from(root.querySelectorAll(selector)).filter((el) => {
    if (isHidden(el)) return false
    if (name === undefined) return true
    const n = accessibleName(el)
    return typeof name === 'string' ? n === name : name.test(n)
  })
}

export function getByRole(root: ParentNode, role: string, name?: string | RegExp): HTMLElement {
  const found = queryAllByRole(root, role, name)
  if (found.length !== 1) {
    const seen = queryAllByRole(root, role).map(accessibleName)
    throw new Error(`Expected one ${role} named ${String(name)}, found ${found.length}. Named ${role}s: ${JSON.stringify(seen)}`)
  }
  return found[0] as HTMLElement
}
