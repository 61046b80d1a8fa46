/** A Float64Array reused from call to call and grown as needed, for one user at a time. */
export class WorkBuffer {
  private values = new Float64Array(0);

  /** The first n values (zeroed when asked; otherwise left as the last user left them). */
  take(n: number, zeroed = false): Float64Array {
    if (this.values.length < n) this.values = new Float64Array(n);
    const view = this.values.subarray(0, n);
    if (zeroed) view.fill(0);
    return view;
  }
}
