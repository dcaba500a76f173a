/** A demo netlist offered in the bench's Examples menu. */
export interface Example {
  /** Stable id, used in the address (`/bench?example=…`) and by tests. */
  id: string;
  /** Menu label. */
  label: string;
  /** One line on what it shows. */
  blurb: string;
  /** The netlist. */
  text: string;
}
