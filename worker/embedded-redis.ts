// biome-ignore-all lint/suspicious/noExplicitAny: fengari (the Lua VM) and ioredis-mock's internals ship no types
/**
 * embedded-redis.ts — run Bull 4.16.5 on ioredis-mock 8.13.1 inside one Node process, for the
 * embedded mode (no REDIS_URL). DEVELOPERS.md ("Queues") says what is shimmed and why.
 *
 * Bull's own code path is untouched: Bull still defines its Lua scripts with
 * `defineCommand`, calls them, uses MULTI, pub/sub and BRPOPLPUSH exactly as it
 * does against a real server. This file only patches *instances* of
 * ioredis-mock (nothing in node_modules is edited, no package is forked).
 *
 * Shims (each one is marked `SHIM n` below and explained in NOTES.md):
 *   1. Lua runner: replaces the mock's per-call-VM `defineCommand` with one
 *      shared fengari state, scripts compiled once and cached, Redis' reply
 *      conversion rules, binary-safe string passing, argument flattening.
 *   2. Lua globals Redis provides and fengari lacks: cmsgpack, cjson, bit, unpack.
 *   3. `status` getter (ioredis has it; Bull waits for 'ready' when it's missing).
 *   4. CLIENT SETNAME/GETNAME/LIST/ID (Bull's worker names its bclient).
 *   5. Blocking BRPOPLPUSH that really blocks and wakes when the list is written.
 *   6. disconnect() rejects a pending blocking call, as ioredis does.
 */

import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import type { Redis } from 'ioredis';
import RedisMock from 'ioredis-mock';
import { Packr, unpackMultiple } from 'msgpackr'; // Bull's own dependency

const require = createRequire(import.meta.url);
// fengari ships no types; it is the Lua 5.3 VM ioredis-mock itself uses.
const fengari: any = require('fengari');
const { lua, lauxlib, lualib } = fengari;

type Raw = (this: unknown, ...args: unknown[]) => unknown;
// ioredis-mock instances, used through members its typings do not declare
type MockClient = Record<string, any>;
export type ClientType = 'client' | 'subscriber' | 'bclient';

// ---------------------------------------------------------------------------
// The mock's synchronous command implementations.
// Inside a Lua script redis.call() must be synchronous, but the mock's public
// methods return Promises. The mock's exported Pipeline class copies every raw
// (sync) command implementation through `_createCommand(name, fn)` in its
// constructor; a subclass that records `fn` gives us exactly the functions the
// mock's own Lua bridge calls (`commands_exports[name].bind(client)`).
// ---------------------------------------------------------------------------
const RAW: Record<string, Raw> = {};
{
  const Pipeline = (RedisMock as any).Pipeline;
  class Capture extends Pipeline {
    _createCommand(name: string, fn: Raw) {
      RAW[name] = fn;
      return () => undefined;
    }
  }
  new (Capture as any)({ customCommands: {} });
  if (!RAW.rpoplpush || !RAW.hgetall)
    throw new Error('ioredis-mock internals changed: raw commands not found');
}

// ---------------------------------------------------------------------------
// SHIM 1 + 2: one shared Lua state with Redis' script environment.
// ---------------------------------------------------------------------------
const utf8 = new TextDecoder('utf-8', { fatal: true });
const packr = new Packr({ useRecords: false, mapsAsObjects: true });
let L: any = null; // created lazily, shared by every embedded client
let current: MockClient | null = null; // client whose script is running now
const compiled = new Map<string, number>(); // sha1 -> registry ref of the compiled chunk

/** Lua string bytes -> JS string (UTF-8, like ioredis' replies); invalid UTF-8 stays a Buffer. */
function luaBytesToJs(u8: Uint8Array): string | Buffer {
  try {
    return utf8.decode(u8);
  } catch {
    return Buffer.from(u8);
  }
}
const luaString = (L: any, i: number) => luaBytesToJs(lua.lua_tolstring(L, i));

/** Number as Redis would send it as a command argument (integers without ".0"). */
const numArg = (L: any, i: number) =>
  lua.lua_isinteger(L, i) ? String(lua.lua_tointeger(L, i)) : String(lua.lua_tonumber(L, i));

function pushNumber(L: any, n: number) {
  // fengari integers are 32-bit; larger values (timestamps!) must be floats.
  if (Number.isInteger(n) && n >= -2147483648 && n <= 2147483647) lua.lua_pushinteger(L, n);
  else lua.lua_pushnumber(L, n);
}
function pushString(L: any, s: string | Uint8Array) {
  lua.lua_pushstring(L, typeof s === 'string' ? Buffer.from(s, 'utf8') : s);
}

/** Push a redis.call() reply with Redis' conversion rules (nil -> false, arrays -> tables). */
function pushReply(L: any, v: unknown) {
  if (v === null || v === undefined || v === false) lua.lua_pushboolean(L, false);
  else if (v === true) lua.lua_pushinteger(L, 1);
  else if (typeof v === 'number') pushNumber(L, v);
  else if (typeof v === 'string' || v instanceof Uint8Array) pushString(L, v);
  else if (Array.isArray(v)) {
    lua.lua_createtable(L, v.length, 0);
    v.forEach((e, i) => {
      pushReply(L, e);
      lua.lua_rawseti(L, -2, i + 1);
    });
  } else if (v instanceof Map) pushReply(L, [...v].flat());
  else if (typeof v === 'object')
    pushReply(L, Object.entries(v as object).flat()); // hgetall
  else pushString(L, String(v));
}

/** Push a plain JS value (cjson/cmsgpack decode): objects -> tables, null -> nil. */
function pushPlain(L: any, v: unknown) {
  if (v === null || v === undefined) lua.lua_pushnil(L);
  else if (typeof v === 'boolean') lua.lua_pushboolean(L, v);
  else if (typeof v === 'number') pushNumber(L, v);
  else if (typeof v === 'string' || v instanceof Uint8Array) pushString(L, v);
  else if (Array.isArray(v)) {
    lua.lua_createtable(L, v.length, 0);
    v.forEach((e, i) => {
      pushPlain(L, e);
      lua.lua_rawseti(L, -2, i + 1);
    });
  } else if (typeof v === 'object') {
    lua.lua_createtable(L, 0, 0);
    for (const [k, e] of Object.entries(v as object)) {
      pushPlain(L, e);
      lua.lua_setfield(L, -2, Buffer.from(k, 'utf8'));
    }
  } else lua.lua_pushnil(L);
}

/** Read a Lua value as plain JS (cjson.encode / cmsgpack.pack input). */
function readPlain(L: any, i: number): unknown {
  i = lua.lua_absindex(L, i);
  switch (lua.lua_type(L, i)) {
    case lua.LUA_TBOOLEAN:
      return lua.lua_toboolean(L, i);
    case lua.LUA_TNUMBER:
      return lua.lua_tonumber(L, i);
    case lua.LUA_TSTRING:
      return luaString(L, i);
    case lua.LUA_TTABLE: {
      const obj: Record<string, unknown> = {};
      const arr: unknown[] = [];
      let isArray = true;
      lua.lua_pushnil(L);
      while (lua.lua_next(L, i) !== 0) {
        const key =
          lua.lua_type(L, -2) === lua.LUA_TNUMBER ? lua.lua_tonumber(L, -2) : String(readPlain(L, -2));
        const val = readPlain(L, -1);
        if (typeof key === 'number' && Number.isInteger(key) && key >= 1) arr[key - 1] = val;
        else isArray = false;
        obj[String(key)] = val;
        lua.lua_pop(L, 1);
      }
      if (isArray && arr.length > 0 && !arr.includes(undefined)) return arr;
      return obj; // empty table -> {} (cjson does the same)
    }
    default:
      return null;
  }
}

/** Script return value -> ioredis reply (Redis rules: numbers truncate, false -> nil, {err}/{ok}). */
function readReply(L: any, i: number): unknown {
  i = lua.lua_absindex(L, i);
  switch (lua.lua_type(L, i)) {
    case lua.LUA_TBOOLEAN:
      return lua.lua_toboolean(L, i) ? 1 : null;
    case lua.LUA_TNUMBER:
      return Math.trunc(lua.lua_tonumber(L, i));
    case lua.LUA_TSTRING:
      return luaString(L, i);
    case lua.LUA_TTABLE: {
      if (lua.lua_getfield(L, i, Buffer.from('err')) === lua.LUA_TSTRING) {
        const e = new Error(String(luaString(L, -1)));
        lua.lua_pop(L, 1);
        return e;
      }
      lua.lua_pop(L, 1);
      if (lua.lua_getfield(L, i, Buffer.from('ok')) === lua.LUA_TSTRING) {
        const s = luaString(L, -1);
        lua.lua_pop(L, 1);
        return s;
      }
      lua.lua_pop(L, 1);
      const out: unknown[] = [];
      for (let k = 1; lua.lua_rawgeti(L, i, k) !== lua.LUA_TNIL; k++) {
        out.push(readReply(L, -1)); // Redis stops at the first nil
        lua.lua_pop(L, 1);
      }
      lua.lua_pop(L, 1);
      return out;
    }
    default:
      return null;
  }
}

/**
 * Register a JS function as a Lua C function. JS exceptions must never escape
 * into fengari (it treats them as fatal), so they become Lua errors here.
 */
function jsFunction(fn: (L: any) => number) {
  return (L: any) => {
    let msg: string;
    try {
      return fn(L);
    } catch (err) {
      msg = err instanceof Error ? err.message : String(err);
    }
    pushString(L, msg);
    return lua.lua_error(L); // outside the try: lua_error unwinds by throwing
  };
}

function setFunctions(L: any, table: string, fns: Record<string, (L: any) => number>) {
  lua.lua_createtable(L, 0, 0);
  for (const [name, fn] of Object.entries(fns)) {
    lua.lua_pushjsfunction(L, jsFunction(fn));
    lua.lua_setfield(L, -2, Buffer.from(name));
  }
  lua.lua_setglobal(L, Buffer.from(table));
}

/** redis.call / redis.pcall: synchronous bridge to the mock's raw commands. */
function redisCall(L: any, protectedCall: boolean): number {
  const n = lua.lua_gettop(L);
  const args: (string | Buffer)[] = [];
  for (let i = 1; i <= n; i++) {
    const t = lua.lua_type(L, i);
    if (t === lua.LUA_TSTRING) args.push(luaString(L, i));
    else if (t === lua.LUA_TNUMBER) args.push(numArg(L, i));
    else throw new Error('ERR Lua redis lib command arguments must be strings or integers');
  }
  if (args.length === 0) throw new Error('ERR Please specify at least one argument for this redis lib call');
  const name = String(args[0]).toLowerCase();
  const fn = RAW[name === 'eval' ? 'evaluate' : name];
  let result: unknown;
  try {
    if (!fn) throw new Error(`ERR unknown command '${name}' called from script`);
    result = fn.apply(current, args.slice(1));
    if (result instanceof Promise)
      throw new Error(`ERR command '${name}' is async in ioredis-mock and cannot run in a script`);
  } catch (err) {
    if (!protectedCall) throw err;
    lua.lua_createtable(L, 0, 1);
    pushString(L, err instanceof Error ? err.message : String(err));
    lua.lua_setfield(L, -2, Buffer.from('err'));
    return 1;
  }
  pushReply(L, result);
  return 1;
}

function luaState() {
  if (L) return L;
  L = lauxlib.luaL_newstate();
  lualib.luaL_openlibs(L); // (the mock also opens fengari's `js` interop lib; we do not)

  setFunctions(L, 'redis', {
    call: (L) => redisCall(L, false),
    pcall: (L) => redisCall(L, true),
  });

  // SHIM 2a: cmsgpack — Bull packs job options / keepJobs with msgpackr and
  // unpacks them in Lua. We decode/encode with msgpackr itself, so the format
  // is exactly what Bull produced.
  setFunctions(L, 'cmsgpack', {
    unpack: (L) => {
      const values = unpackMultiple(Buffer.from(lua.lua_tolstring(L, 1))) as unknown[];
      for (const v of values) pushPlain(L, v);
      return values.length;
    },
    pack: (L) => {
      const n = lua.lua_gettop(L);
      const parts: Buffer[] = [];
      for (let i = 1; i <= n; i++) parts.push(packr.pack(readPlain(L, i)));
      pushString(L, Buffer.concat(parts));
      return 1;
    },
  });

  // SHIM 2b: cjson — used by the stalled-jobs script to read job opts.
  setFunctions(L, 'cjson', {
    decode: (L) => {
      pushPlain(L, JSON.parse(String(luaString(L, 1))));
      return 1;
    },
    encode: (L) => {
      pushString(L, JSON.stringify(readPlain(L, 1)));
      return 1;
    },
  });

  // SHIM 2c: bit (LuaBitOp) — 32-bit signed results, operands taken modulo 2^32.
  const int = (L: any, i: number) => lua.lua_tonumber(L, i) | 0;
  const fold = (op: (a: number, b: number) => number) => (L: any) => {
    let r = int(L, 1);
    for (let i = 2; i <= lua.lua_gettop(L); i++) r = op(r, int(L, i));
    lua.lua_pushinteger(L, r | 0);
    return 1;
  };
  const unary = (op: (a: number, n: number) => number) => (L: any) => {
    lua.lua_pushinteger(L, op(int(L, 1), int(L, 2) & 31) | 0);
    return 1;
  };
  setFunctions(L, 'bit', {
    tobit: unary((a) => a),
    bnot: unary((a) => ~a),
    band: fold((a, b) => a & b),
    bor: fold((a, b) => a | b),
    bxor: fold((a, b) => a ^ b),
    lshift: unary((a, n) => a << n),
    rshift: unary((a, n) => a >>> n),
    arshift: unary((a, n) => a >> n),
  });

  // SHIM 2d: Lua 5.1 names Redis scripts rely on (fengari is Lua 5.3), and the
  // helper functions of Redis' `redis` table.
  const prelude = `
    unpack = unpack or table.unpack
    loadstring = loadstring or load
    redis.error_reply = function(msg) return { err = msg } end
    redis.status_reply = function(msg) return { ok = msg } end
    redis.log = function() end
    redis.LOG_DEBUG, redis.LOG_VERBOSE, redis.LOG_NOTICE, redis.LOG_WARNING = 0, 1, 2, 3
  `;
  if (lauxlib.luaL_dostring(L, Buffer.from(prelude)) !== 0) throw new Error(lua.lua_tojsstring(L, -1));
  return L;
}

function setArrayGlobal(L: any, name: string, values: (string | Buffer)[]) {
  lua.lua_createtable(L, values.length, 0);
  values.forEach((v, i) => {
    pushString(L, v);
    lua.lua_rawseti(L, -2, i + 1);
  });
  lua.lua_setglobal(L, Buffer.from(name));
}

/** Run a script: compiled once per source (cached by sha1), executed in the shared state. */
function runScript(
  client: MockClient,
  sha: string,
  source: string,
  numKeys: number,
  args: (string | Buffer)[],
) {
  return execute(luaState(), client, sha, source, numKeys, args);
}

function execute(
  L: any,
  client: MockClient,
  sha: string,
  source: string,
  numKeys: number,
  args: (string | Buffer)[],
) {
  let ref = compiled.get(sha);
  if (ref === undefined) {
    if (lauxlib.luaL_loadbuffer(L, Buffer.from(source), null, Buffer.from(`=f_${sha}`)) !== 0) {
      const msg = lua.lua_tojsstring(L, -1);
      lua.lua_settop(L, 0);
      throw new Error(`ERR Error compiling script (new function): ${msg}`);
    }
    ref = lauxlib.luaL_ref(L, lua.LUA_REGISTRYINDEX) as number;
    compiled.set(sha, ref);
  }
  lua.lua_rawgeti(L, lua.LUA_REGISTRYINDEX, ref);
  setArrayGlobal(L, 'KEYS', args.slice(0, numKeys));
  setArrayGlobal(L, 'ARGV', args.slice(numKeys));
  current = client;
  let status: number;
  try {
    status = lua.lua_pcall(L, 0, 1, 0);
  } finally {
    current = null;
  }
  if (status !== 0) {
    const msg = lua.lua_tojsstring(L, -1) ?? 'unknown Lua error';
    lua.lua_settop(L, 0);
    throw new Error(`ERR Error running script (call to f_${sha}): ${msg}`);
  }
  const reply = readReply(L, -1);
  lua.lua_settop(L, 0);
  if (reply instanceof Error) throw reply;
  return reply;
}

/**
 * ioredis sends command arguments flattened one level (Bull passes one array,
 * or `keys, [args]`), with null/undefined as "" and numbers as strings. Buffers
 * stay Buffers: they enter Lua byte-for-byte (msgpack payloads are binary).
 */
function flattenArgs(args: unknown[]): (string | Buffer)[] {
  return args
    .flat(1)
    .map((a) => (a == null ? '' : Buffer.isBuffer(a) ? a : typeof a === 'string' ? a : String(a)));
}

/** Promise + optional node-style callback, like ioredis commands. */
function asCommand<T>(args: unknown[], run: (args: unknown[]) => Promise<T> | T): Promise<T> {
  const cb =
    typeof args[args.length - 1] === 'function' ? (args.pop() as (e: unknown, v?: T) => void) : undefined;
  const p = new Promise<T>((resolve) => resolve(run(args)));
  if (cb)
    p.then(
      (v) => cb(null, v),
      (e) => cb(e),
    );
  return p;
}

// ---------------------------------------------------------------------------
// Patching one mock instance.
// ---------------------------------------------------------------------------
let nextClientId = 1;
const liveClients = new Set<MockClient>();

function patch(mock: MockClient): MockClient {
  if (!mock.context?.modifiedKeyEvents)
    throw new Error('ioredis-mock internals changed: context.modifiedKeyEvents not found');
  const id = nextClientId++;
  let connectionName: string | null = null;
  const pendingBlocking = new Set<(err: Error) => void>();
  liveClients.add(mock);

  // SHIM 1: defineCommand -> cached Lua runner. Bull defines each script once
  // per client; ioredis-mock's own version builds a new Lua VM and re-parses the
  // script on every call (~2.5 ms each) and passes Buffers to Lua as JS objects.
  mock.defineCommand = (
    name: string,
    { numberOfKeys, lua: source }: { numberOfKeys: number; lua: string },
  ) => {
    const sha = createHash('sha1').update(source).digest('hex');
    const sync = (...flat: unknown[]) => runScript(mock, sha, source, numberOfKeys, flattenArgs(flat));
    // used by the mock's MULTI/pipeline, which flattens args itself and runs all
    // queued commands synchronously in one tick (so MULTI stays atomic)
    mock.customCommands[name] = sync;
    mock[name] = (...args: unknown[]) =>
      asCommand(args, (a) => {
        if (!mock.connected) throw new Error('Connection is closed.');
        return sync(...a);
      });
  };

  // SHIM 3: ioredis exposes `status`; Bull's isRedisReady() waits for a 'ready'
  // event when status !== 'ready', and the mock emitted 'ready' long before.
  Object.defineProperty(mock, 'status', {
    configurable: true,
    get: () => (mock.connected ? 'ready' : 'end'),
  });

  // SHIM 4: CLIENT. Bull's worker calls CLIENT SETNAME on its bclient and
  // getWorkers() parses CLIENT LIST; the mock throws "Unsupported command".
  mock.client = (...args: unknown[]) =>
    asCommand(args, ([sub, ...rest]) => {
      switch (String(sub).toLowerCase()) {
        case 'setname':
          connectionName = String(rest[0] ?? '');
          return 'OK';
        case 'getname':
          return connectionName;
        case 'id':
          return id;
        case 'list':
          return [...liveClients]
            .filter((c) => c.connected && c.keyData === mock.keyData)
            .map(
              (c) =>
                `id=${c.__embeddedId} addr=embedded:${c.__embeddedId} name=${c.__embeddedName() ?? ''} db=0`,
            )
            .join('\n');
        default:
          throw new Error(
            `ERR unknown subcommand '${sub}' (embedded redis supports SETNAME, GETNAME, ID, LIST)`,
          );
      }
    });
  mock.__embeddedId = id;
  mock.__embeddedName = () => connectionName;

  // SHIM 5: BRPOPLPUSH. The mock's version is RPOPLPUSH (returns null at once),
  // so Bull's worker would never sleep nor reliably wake. This one pops at once
  // if it can, else waits until the mock reports a write to the source key (the
  // mock's own 'modified' event, emitted on every data.set) or the timeout
  // (seconds, 0 = forever) elapses -> null, like Redis.
  const keyPrefix: string = mock.options?.keyPrefix ?? '';
  // Every mock instance of a dataset (and every pending BRPOPLPUSH) listens on
  // this one emitter; > 10 listeners is normal here, not a leak.
  mock.context.modifiedKeyEvents.setMaxListeners(0);
  mock.brpoplpush = (...args: unknown[]) =>
    asCommand(args, ([src, dst, timeout]) => {
      const source = String(src);
      const dest = String(dst);
      const rpoplpush = RAW.rpoplpush!;
      const pop = () => rpoplpush.call(mock, source, dest) as string | null;
      if (!mock.connected) throw new Error('Connection is closed.');
      const first = pop();
      if (first != null) return first;
      return new Promise<string | null>((resolve, reject) => {
        let timer: NodeJS.Timeout | undefined;
        const events = mock.context.modifiedKeyEvents;
        const finish = (err: Error | null, value: string | null) => {
          events.off('modified', onModified);
          if (timer) clearTimeout(timer);
          pendingBlocking.delete(onClose);
          err ? reject(err) : resolve(value);
        };
        const onClose = (err: Error) => finish(err, null);
        // 'modified' fires synchronously inside the writing command (maybe in the
        // middle of a Lua script); retry after it, on the next macrotask.
        let scheduled = false;
        const onModified = (key: string) => {
          if (key !== keyPrefix + source || scheduled) return;
          scheduled = true;
          setImmediate(() => {
            scheduled = false;
            if (!pendingBlocking.has(onClose)) return;
            try {
              const v = pop();
              if (v != null) finish(null, v);
            } catch (e) {
              finish(e as Error, null);
            }
          });
        };
        events.on('modified', onModified);
        pendingBlocking.add(onClose);
        const seconds = Number(timeout);
        if (seconds > 0) timer = setTimeout(() => finish(null, null), seconds * 1000);
      });
    });

  // SHIM 6: disconnect() (and quit(), which the mock implements by calling
  // this.disconnect()) aborts a pending blocking command with the error ioredis
  // gives, "Connection is closed.", which Bull expects when it force-reconnects
  // its bclient on pause/close.
  const disconnect = mock.disconnect.bind(mock);
  mock.disconnect = () => {
    for (const abort of [...pendingBlocking]) abort(new Error('Connection is closed.'));
    disconnect();
  };

  return mock;
}

export interface EmbeddedRedisOptions {
  /** Instances with the same host/port/db share one dataset (ioredis-mock's context map). */
  host?: string;
  port?: number;
  db?: number;
}

/** One patched ioredis-mock client. All clients with the same host/port/db share data. */
export function createEmbeddedRedis(type: ClientType = 'client', opts: EmbeddedRedisOptions = {}): Redis {
  const mock = new RedisMock({
    host: opts.host ?? 'bull-embedded',
    port: opts.port ?? 6379,
    db: opts.db ?? 0,
    // Bull refuses bclient/subscriber clients with these set (same as ioredis)
    ...(type === 'client' ? {} : { maxRetriesPerRequest: null, enableReadyCheck: false }),
  }) as MockClient;
  return patch(mock) as unknown as Redis;
}

/**
 * A Bull `createClient` option backed by the embedded store, plus `close()` to
 * disconnect every client it made (Bull does not close clients it did not create).
 * One shared 'client' and 'subscriber' per factory, a new 'bclient' per queue,
 * as Bull's docs recommend for createClient.
 */
export function embeddedBullClients(opts: EmbeddedRedisOptions = {}) {
  const made: Redis[] = [];
  const shared: Partial<Record<ClientType, Redis>> = {};
  const createClient = (type: ClientType) => {
    if (type !== 'bclient' && shared[type]) return shared[type]!;
    const c = createEmbeddedRedis(type, opts);
    made.push(c);
    if (type !== 'bclient') shared[type] = c;
    return c;
  };
  const close = async () => {
    for (const c of made.splice(0)) {
      c.disconnect();
      liveClients.delete(c as unknown as MockClient);
    }
    delete shared.client;
    delete shared.subscriber;
  };
  return { createClient, close };
}

/** Wipe one embedded dataset (tests). */
export async function flushEmbedded(opts: EmbeddedRedisOptions = {}) {
  const c = createEmbeddedRedis('client', opts);
  await c.flushall();
  c.disconnect();
  liveClients.delete(c as unknown as MockClient);
}
