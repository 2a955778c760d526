/** A captured CAN frame before the gateway stamps it: true time of capture, id and data as hex. */
export interface FrameT {
  t: number;
  id: string;
  data: string;
}
