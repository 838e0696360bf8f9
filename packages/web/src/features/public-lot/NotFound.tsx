/** The same page for every code that is not a listed lot: it says nothing about why. */
export function NotFound() {
  return (
    <section className="pl-section pl-notfound" aria-labelledby="pl-nf-h">
      <h1 id="pl-nf-h">No public history at this address</h1>
      <p>Check the code on the tag and try again, or ask the dealer who showed you the lot.</p>
    </section>
  );
}
