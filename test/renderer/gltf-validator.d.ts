// The part of the Khronos glTF validator's API (npm gltf-validator) the tests use.
declare module 'gltf-validator' {
  export interface ValidatorMessage {
    code: string;
    message: string;
    /** 0 error, 1 warning, 2 information, 3 hint. */
    severity: number;
    pointer?: string;
    offset?: number;
  }
  export interface ValidatorReport {
    issues: { numErrors: number; numWarnings: number; numInfos: number; numHints: number; messages: ValidatorMessage[]; truncated: boolean };
    info?: Record<string, unknown>;
  }
  export function validateBytes(data: Uint8Array, options?: { uri?: string; maxIssues?: number; externalResourceFunction?: (uri: string) => Promise<Uint8Array> }): Promise<ValidatorReport>;
  export function version(): string;
}
