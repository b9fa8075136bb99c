export function ReviewScreen() {
  return (
    <section className="screen" aria-labelledby="review-title">
      <h2 id="review-title">Cruise review</h2>
      <p>Cruise review: summary, charts, latitude bands and quality findings.</p>
    </section>
  );
}
