/**
 * A function a module needs from a module that depends on it (grow-out needs the feed book's totals,
 * the feed book needs grow-out's groups). The module declares the port, the composition root plugs
 * the other module's function in, so the two folders never import each other both ways.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export interface Port<F extends (...args: any[]) => any> {
  (...args: Parameters<F>): ReturnType<F>;
  plug(implementation: F): void;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function port<F extends (...args: any[]) => any>(name: string, fallback?: F): Port<F> {
  let implementation: F | undefined = fallback;
  const call = ((...args: Parameters<F>) => {
    if (!implementation) throw new Error(`Nothing is plugged into the port "${name}"; the composition root wires it`);
    return implementation(...args);
  }) as Port<F>;
  call.plug = (next: F) => {
    implementation = next;
  };
  return call;
}
