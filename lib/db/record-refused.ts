/**
 * A write refused by what is already stored (a top load of another coil, a post-mortem already
 * completed): thrown inside the transaction so nothing is written, and carrying the form field it
 * concerns so the action can show the message under that field. `conflict` marks a 409-style clash.
 */
export class RecordRefusedError extends Error {
  constructor(
    readonly field: string,
    message: string,
    readonly conflict = false,
  ) {
    super(message);
    this.name = "RecordRefusedError";
  }
}
