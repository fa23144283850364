// The engine compiles without DOM or Node types so that it stays pure. These are the few
// web-platform globals it uses; they exist in Node 20, browsers and Web Workers alike.
declare class TextDecoder {
  constructor(label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean });
  readonly encoding: string;
  decode(input?: Uint8Array, options?: { stream?: boolean }): string;
}
declare class TextEncoder {
  constructor();
  encode(input?: string): Uint8Array;
}
declare const performance: { now(): number };
