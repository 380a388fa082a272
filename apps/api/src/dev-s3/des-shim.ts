import crypto from 'node:crypto';

type CipherArgs = [algorithm: string, key: crypto.CipherKey, iv: crypto.BinaryLike | null, options?: object];

/**
 * Lets the S3 fake (s3rver 3.7) page long listings on this Node.js. It writes its continuation tokens with
 * single DES (`createCipheriv('des', …)`), which OpenSSL 3 keeps in its legacy provider, so every listing of
 * more than 1,000 keys failed with InternalError. Three-key DES with the same key three times (encrypt,
 * decrypt, encrypt) is single DES exactly (NIST SP 800-67, keying option 3), and OpenSSL 3 still offers it.
 * Only the fake's own process installs this (and the tests that run the fake in theirs); the product never
 * uses DES.
 */
export function installSingleDesForS3Fake(): void {
  const isSingleDes = (algorithm: string) => ['des', 'des-cbc'].includes(algorithm.toLowerCase());
  const tripled = (key: crypto.CipherKey) => {
    const k = Buffer.from(key as Uint8Array);
    return Buffer.concat([k, k, k]);
  };
  const cipher = crypto.createCipheriv as (...args: CipherArgs) => crypto.Cipher;
  const decipher = crypto.createDecipheriv as (...args: CipherArgs) => crypto.Decipher;
  if ((cipher as { desShim?: true }).desShim) return;
  const createCipheriv = (...[algorithm, key, iv, options]: CipherArgs) =>
    isSingleDes(algorithm) ? cipher('des-ede3-cbc', tripled(key), iv) : cipher(algorithm, key, iv, options);
  const createDecipheriv = (...[algorithm, key, iv, options]: CipherArgs) =>
    isSingleDes(algorithm)
      ? decipher('des-ede3-cbc', tripled(key), iv)
      : decipher(algorithm, key, iv, options);
  Object.assign(createCipheriv, { desShim: true });
  // s3rver calls these through the module object, whose functions are writable properties.
  Object.assign(crypto, { createCipheriv, createDecipheriv });
}
