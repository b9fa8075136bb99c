/** The standing caution. It is never dismissible: the map and the risk figures are aids only. */
export function NavigationNotice() {
  return (
    <aside className="navigation-notice" aria-label="Navigation caution" data-testid="navigation-notice">
      <strong>Not for navigation.</strong> The map is an overview of observed ice, not a
      navigation chart. POLARIS figures are decision support only: the Polar Code, the
      ship&apos;s operating manual, the master&apos;s judgement and local regulations prevail.
    </aside>
  );
}
