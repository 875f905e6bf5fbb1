import { routes, opensSignedInArea } from '../app/app-routes';
import { asksWhoIsSignedIn, earlyCalls, ME_URL, startEarlyCalls } from './early-calls';

describe('the early calls', () => {
  it('ask who is signed in on exactly the pages whose route asks it', () => {
    const firsts = ['', 'sign-in', 'invitations', 'nowhere'];
    for (const r of routes) if (r.path !== undefined) firsts.push(r.path.split('/')[0]!);
    for (const first of firsts)
      expect([first, asksWhoIsSignedIn(`/${first}/x`)]).toEqual([
        first,
        opensSignedInArea(`/${first}/x`),
      ]);
  });

  it("build the page's data calls with its :params and the acting lab", () => {
    expect(earlyCalls('/board/rounds/r1', 'l1')).toEqual(['/api/v1/rounds/r1/board']);
    expect(earlyCalls('/bench/rounds/r1', 'l1')).toEqual([
      '/api/v1/my/rounds/r1?labId=l1',
      '/api/v1/rounds/r1/submission?labId=l1',
      '/api/v1/rounds/r1/submission/attachments?labId=l1',
      '/api/v1/my/instrument-checks?labId=l1',
    ]);
    expect(earlyCalls('/bench/rounds/r1', null)[0]).toBe('/api/v1/my/rounds/r1');
    expect(earlyCalls('/bench/rounds/r1/more', 'l1')).toEqual([]);
    expect(earlyCalls('/bench', 'l1')).toEqual([]);
  });

  function fakeFetch(meStatus: number) {
    const asked: string[] = [];
    const fetchFn = ((url: string) => {
      asked.push(url);
      // jsdom has no Response: the few members the early script reads.
      const answer = {
        ok: url !== ME_URL || meStatus === 200,
        json: () => Promise.resolve(url === ME_URL ? { actingLabId: 'l1' } : {}),
        clone: () => answer,
      };
      return Promise.resolve(answer);
    }) as unknown as typeof fetch;
    return { asked, fetchFn };
  }

  it('asks for the data only once the signed-in person is known', async () => {
    const { asked, fetchFn } = fakeFetch(200);
    const started = startEarlyCalls('/board/rounds/r1', fetchFn);
    await new Promise((r) => setTimeout(r, 0));
    expect(asked).toEqual([ME_URL, '/api/v1/rounds/r1/board']);
    expect([...started.keys()]).toEqual(asked);
  });

  it('asks nothing more for a signed-out visitor, and nothing at all on public pages', async () => {
    const signedOut = fakeFetch(401);
    startEarlyCalls('/board/rounds/r1', signedOut.fetchFn);
    await new Promise((r) => setTimeout(r, 0));
    expect(signedOut.asked).toEqual([ME_URL]);
    const visitor = fakeFetch(200);
    expect(startEarlyCalls('/sign-in', visitor.fetchFn).size).toBe(0);
    expect(visitor.asked).toEqual([]);
  });
});
