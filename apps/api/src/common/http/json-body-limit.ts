import type { NextFunction, Request, Response } from 'express';

/**
 * Express's JSON parser stops keeping a body at its limit but still reads the rest of it before
 * answering, so a client could hold a connection and push gigabytes through it. This answers 413 at
 * once, on the declared length or on the first byte past the limit, and closes the connection.
 */
export function refuseOversizedJson(limitBytes: number) {
  return (req: Request, res: Response, next: NextFunction): void => {
    if (!req.is('application/json')) return next();
    const tooLarge = () => {
      if (res.headersSent) return;
      res.setHeader('Connection', 'close');
      res.status(413).json({ message: 'The request is too large.' });
    };
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > limitBytes) return tooLarge();
    let received = 0;
    const count = (chunk: Buffer) => {
      received += chunk.length;
      if (received > limitBytes) {
        req.off('data', count);
        tooLarge();
      }
    };
    req.on('data', count);
    req.once('end', () => req.off('data', count));
    next();
  };
}
