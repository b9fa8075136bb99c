export function ExchangeScreen() {
  return (
    <section className="screen" aria-labelledby="exchange-title">
      <h2 id="exchange-title">Exchange</h2>
      <p>Exchange: export the log, import and merge logs from other laptops.</p>
    </section>
  );
}
