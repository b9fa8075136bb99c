export function MapScreen() {
  return (
    <section className="screen" aria-labelledby="map-title">
      <h2 id="map-title">Ice map</h2>
      <p>The ice map: the cruise track and observations on an offline basemap.</p>
    </section>
  );
}
