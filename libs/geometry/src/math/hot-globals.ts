/**
 * Math and Infinity as module bindings, for the nesting search's hot loops. Inside a vm context (Jest runs every
 * test in one, its global object behind a Proxy) each global lookup goes through the context's interceptor,
 * and the search ran ten times slower there than in Node or a browser worker. A module binding is read like
 * any other variable.
 */
export const M = Math;
export const INF = Infinity;
