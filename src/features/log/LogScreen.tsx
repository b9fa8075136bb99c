export function LogScreen() {
  return (
    <section className="screen" aria-labelledby="log-title">
      <h2 id="log-title">Watch log</h2>
      <p>The watch log: the observation form and the list of the cruise's observations.</p>
    </section>
  );
}
