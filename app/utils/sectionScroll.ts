// Going to a section of the long call page: below the sticky header, not under it, and with the
// keyboard's focus on the section so a screen reader starts reading there.
const HEADER_PX = 72

export function goToSection(headingId: string, focus = false) {
  const heading = document.getElementById(headingId)
  if (!heading) return false
  window.scrollTo({ top: heading.getBoundingClientRect().top + window.scrollY - HEADER_PX })
  if (focus) {
    const target = heading.closest('section') ?? heading
    if (!target.hasAttribute('tabindex')) target.setAttribute('tabindex', '-1')
    target.focus({ preventScroll: true })
  }
  return true
}
