/** /compare — placeholder replaced below. */
export function Component() {
  return <p>Compare</p>;
}
