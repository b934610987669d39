/**
 * Reads an SQLite write-ahead log from outside (https://www.sqlite.org/fileformat.html#the_write_ahead_log):
 * how many frames belong to committed transactions and how many follow the last commit. Frames after the last
 * commit are a transaction's pages written before it committed (SQLite spills them when its page cache fills),
 * so seeing some at the moment of a kill proves the kill landed in the middle of a write.
 */
import { closeSync, openSync, readSync, fstatSync } from "node:fs";

const HEADER = 32;
const FRAME_HEADER = 24;

export interface WalState {
  committedFrames: number;
  uncommittedFrames: number;
}

/** Incremental reader: each call reads only the frames appended since the last one. */
export class WalWatcher {
  private offset = HEADER;
  private salts: [number, number] | null = null;
  private state: WalState = { committedFrames: 0, uncommittedFrames: 0 };

  constructor(private readonly file: string) {}

  read(): WalState {
    let fd: number;
    try {
      fd = openSync(this.file, "r");
    } catch {
      return { committedFrames: 0, uncommittedFrames: 0 }; // no WAL yet
    }
    try {
      const size = fstatSync(fd).size;
      if (size < HEADER) return this.state;
      const header = Buffer.alloc(HEADER);
      readSync(fd, header, 0, HEADER, 0);
      const pageSize = header.readUInt32BE(8);
      const salts: [number, number] = [header.readUInt32BE(16), header.readUInt32BE(20)];
      if (!this.salts || this.salts[0] !== salts[0] || this.salts[1] !== salts[1]) {
        // A checkpoint restarted the log from its beginning with new salts.
        this.salts = salts;
        this.offset = HEADER;
        this.state = { committedFrames: 0, uncommittedFrames: 0 };
      }
      const frameSize = FRAME_HEADER + pageSize;
      const frameHeader = Buffer.alloc(FRAME_HEADER);
      while (this.offset + frameSize <= size) {
        readSync(fd, frameHeader, 0, FRAME_HEADER, this.offset);
        // Frames left over from before the restart carry the old salts: the log ends there.
        if (frameHeader.readUInt32BE(8) !== salts[0] || frameHeader.readUInt32BE(12) !== salts[1]) break;
        const commit = frameHeader.readUInt32BE(4) !== 0;
        if (commit) this.state = { committedFrames: this.state.committedFrames + this.state.uncommittedFrames + 1, uncommittedFrames: 0 };
        else this.state = { ...this.state, uncommittedFrames: this.state.uncommittedFrames + 1 };
        this.offset += frameSize;
      }
      return this.state;
    } finally {
      closeSync(fd);
    }
  }
}

/** The whole log read from scratch. */
export function readWal(file: string): WalState {
  return new WalWatcher(file).read();
}
