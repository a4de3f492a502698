/**
 * Types for the parts of @cornerstonejs/codec-openjpeg 1.3.6 (an emscripten build of OpenJPEG,
 * CommonJS, shipped without types) that jpeg2000.ts uses.
 */
declare module '@cornerstonejs/codec-openjpeg/decodewasmjs' {
  export interface OpenJpegFrameInfo {
    width: number;
    height: number;
    bitsPerSample: number;
    componentCount: number;
    isSigned: boolean;
  }
  export interface OpenJpegDecoder {
    /** A view of `length` bytes in the wasm heap to copy the codestream into. */
    getEncodedBuffer(length: number): Uint8Array;
    /** A view of the decoded samples in the wasm heap (valid until the next call). */
    getDecodedBuffer(): Uint8Array;
    readHeader(): void;
    decode(): void;
    getFrameInfo(): OpenJpegFrameInfo;
    delete(): void;
  }
  export interface OpenJpegModule {
    J2KDecoder: new () => OpenJpegDecoder;
  }
  const factory: (options?: { print?: (s: string) => void; printErr?: (s: string) => void }) => Promise<OpenJpegModule>;
  export default factory;
}
