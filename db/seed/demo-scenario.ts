/**
 * The demo scenario: an invented PT provider running an invented DLS scheme with 26 invented labs,
 * three published rounds and one round collecting results. Values come from a seeded generator, so
 * every load is the same. Among the labs: one reports a radius as a diameter, one has a
 * dust-inflated result, one is late, one (Aldergrove, the lab1 demo sign-in) has an open
 * investigation, and the assessor holds grants from two labs.
 *
 * Evaluations go through the same services as the product (compute, commit, publish), so the demo
 * board, reports and investigations are what a coordinator would have produced.
 */
import type { DataSource, EntityManager } from 'typeorm';
import {
  AssessorGrant,
  Enrolment,
  InstrumentCheck,
  Investigation,
  type Organisation,
  Round,
  Scheme,
  Shipment,
  Submission,
  TestItem,
  User,
} from '../entities';
import { judgeInstrumentCheck } from '../../shared/bench/instrument-check';
import { DEFAULT_INSTRUCTIONS, DLS_DEFAULT_MEASURANDS } from '../../shared/contracts/rounds';
import { saveDemoMeasurand } from './demo-rows';
import type { SubmissionData } from '../../shared/contracts/submission';
import { mulberry32 } from '../../shared/stats/synthetic-round';
import type { AppContext } from '../../api/src/services/context';
import {
  commitEvaluation,
  computeDraft,
  publishEvaluation,
} from '../../api/src/services/evaluation';
import { loadSessionUser } from '../../api/src/services/users';
import { CODE_ALPHABET } from '../../api/src/services/enrolment';
import { seedPrecisionStudy } from './demo-precision';
import { seedDemoBilling } from './demo-billing';

export const DEMO_SCHEME_CODE = 'NPS-DLS';

interface ItemSpec {
  code: string;
  material: string;
  nominal: number;
  /** The DLS Z-average a careful lab finds, nm, and the PDI. */
  trueZ: number;
  truePdi: number;
}

interface RoundSpec {
  /** The part the round plays in the story (its code follows from its dates). */
  story: 'first' | 'second' | 'blunders' | 'current';
  code: string;
  title: string;
  dueAt: string;
  state: 'published' | 'collecting';
  items: ItemSpec[];
}

const ROUND_TEMPLATES: RoundSpec[] = [
  {
    story: 'first',
    code: '',
    title: 'Polystyrene latex, two sizes',
    dueAt: '',
    state: 'published',
    items: [
      {
        code: 'A',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 60 nm',
        nominal: 60,
        trueZ: 64.2,
        truePdi: 0.035,
      },
      {
        code: 'B',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 100 nm',
        nominal: 100,
        trueZ: 104.6,
        truePdi: 0.025,
      },
    ],
  },
  {
    story: 'second',
    code: '',
    title: 'Latex and colloidal silica',
    dueAt: '',
    state: 'published',
    items: [
      {
        code: 'A',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 200 nm',
        nominal: 200,
        trueZ: 206.3,
        truePdi: 0.02,
      },
      {
        code: 'B',
        material: 'Colloidal silica in water, nominal 80 nm',
        nominal: 80,
        trueZ: 88.9,
        truePdi: 0.09,
      },
    ],
  },
  {
    story: 'blunders',
    code: '',
    title: 'Polystyrene latex, paired items',
    dueAt: '',
    state: 'published',
    items: [
      {
        code: 'A',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 100 nm',
        nominal: 100,
        trueZ: 103.9,
        truePdi: 0.03,
      },
      {
        code: 'B',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 100 nm (second lot)',
        nominal: 100,
        trueZ: 106.1,
        truePdi: 0.032,
      },
    ],
  },
  {
    story: 'current',
    code: '',
    title: 'Silica and latex, current round',
    dueAt: '',
    state: 'collecting',
    items: [
      {
        code: 'A',
        material: 'Colloidal silica in water, nominal 50 nm',
        nominal: 50,
        trueZ: 57.4,
        truePdi: 0.11,
      },
      {
        code: 'B',
        material: 'Polystyrene latex in 10 mM NaCl, nominal 150 nm',
        nominal: 150,
        trueZ: 155.2,
        truePdi: 0.022,
      },
    ],
  },
];

/**
 * Days from "today" (the clock at seeding time) to each round's results-due date: the demo's past
 * lies in the past and the collecting round is due in a little over two weeks, whenever it is loaded.
 */
const DUE_IN_DAYS: Record<RoundSpec['story'], number> = {
  first: -581,
  second: -397,
  blunders: -216,
  current: 16,
};

/** The story's rounds dated from `now`; codes are NPS-<year of the due date>-<A, B, … in that year>. */
export function demoRounds(now: Date): RoundSpec[] {
  const perYear = new Map<number, number>();
  return ROUND_TEMPLATES.map((t) => {
    const due = addDays(now, DUE_IN_DAYS[t.story]);
    due.setUTCHours(17, 0, 0, 0);
    const year = due.getUTCFullYear();
    const n = perYear.get(year) ?? 0;
    perYear.set(year, n + 1);
    return { ...t, code: `NPS-${year}-${String.fromCharCode(65 + n)}`, dueAt: due.toISOString() };
  });
}

/** Roles the invented labs play in the story (index into the lab list). */
const LAB1 = 0; // Aldergrove: viscosity slip in the 'blunders' round → open investigation
const RADIUS_LAB = 6; // reports the radius for item A in the 'blunders' round
const DUST_LAB = 10; // dust-inflated item B in the 'blunders' round
const LATE_LAB = 13; // late in the 'blunders' round (extension), not yet submitted in the current one

const INSTRUMENTS = [
  'DLS sizer, 633 nm, backscatter 173°',
  'DLS sizer, 532 nm, 90° and 173°',
  'Multi-angle light-scattering goniometer, 633 nm',
  'Compact DLS analyser, 658 nm, 90°',
];

const silentMailer = { send: () => Promise.resolve(undefined), close: () => undefined };

export async function hasDemoScenario(ds: DataSource): Promise<boolean> {
  return ds.getRepository(Scheme).exists({ where: { code: DEMO_SCHEME_CODE } });
}

/** Loads the rounds, results, evaluations, investigations, instrument checks and grants. */
export async function seedScenario(
  ds: DataSource,
  labIds: string[],
  publicUrl = 'http://localhost:3000',
  now = new Date(),
): Promise<void> {
  if (await hasDemoScenario(ds)) return;
  const ROUNDS = demoRounds(now);
  const rnd = mulberry32(20261201);
  const normal = (): number => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  const coordinator = await ds
    .getRepository(User)
    .findOneByOrFail({ email: 'coordinator@ringlet.example' });
  const actor = (await loadSessionUser(ds.manager, coordinator.id))!;
  const ctx: AppContext = {
    ds,
    config: { mode: 'demo', publicUrl } as AppContext['config'],
    mailer: silentMailer,
    log: () => undefined,
  };
  // Each lab keeps a personal bias and precision across rounds (a track record with character).
  const labBias = labIds.map(() => 0.012 * normal());
  const labNoise = labIds.map(() => 0.004 + 0.006 * rnd());

  const scheme = await ds.getRepository(Scheme).save({
    code: DEMO_SCHEME_CODE,
    name: 'Nanoparticle sizing by DLS',
    description:
      'Twice-yearly proficiency testing of the cumulants mean diameter (Z-average) and polydispersity index of latex and silica suspensions measured by dynamic light scattering (ISO 22412).',
    defaultMeasurands: [...DLS_DEFAULT_MEASURANDS],
    rules:
      'Labs appear in reports only by participant code. Assigned values by consensus (ISO 13528 Algorithm A); σ_pt as stated per round. Results are scored with z (or z′ when u(x_pt) is not negligible).',
  });

  for (const spec of ROUNDS) {
    const roundId = await ds.transaction(async (em) => {
      const round = await em.save(
        Round,
        em.create(Round, {
          schemeId: scheme.id,
          code: spec.code,
          title: spec.title,
          state: spec.state === 'published' ? 'closed' : 'collecting',
          resultsDueAt: new Date(spec.dueAt),
          enrolmentClosesOn: isoDate(addDays(new Date(spec.dueAt), -60)),
          dispatchOn: isoDate(addDays(new Date(spec.dueAt), -40)),
          instructions: DEFAULT_INSTRUCTIONS,
          feeMinor: 48000,
          currency: 'EUR',
        }),
      );
      const items = [];
      for (const [i, it] of spec.items.entries()) {
        items.push(
          await em.save(
            TestItem,
            em.create(TestItem, {
              roundId: round.id,
              code: it.code,
              material: it.material,
              nominalSizeNm: it.nominal,
              storageNotes: 'Store at 2–8 °C. Do not freeze.',
              handlingNotes:
                'Invert gently ten times before sampling; do not sonicate. Equilibrate at the protocol temperature before measuring.',
              position: i,
            }),
          ),
        );
      }
      const measurands = [];
      for (const [i, m] of DLS_DEFAULT_MEASURANDS.entries()) {
        measurands.push(
          await saveDemoMeasurand(
            em,
            round.id,
            {
              ...m,
              // fitness for purpose: 4 % of x_pt for the Z-average; the round's robust SD for PDI
              sigmaPtRule:
                m.key === 'z_average' ? { kind: 'percent', percent: 4 } : { kind: 'robust-sd' },
            },
            i,
          ),
        );
      }
      const codes = new Set<string>();
      const drawCode = () => {
        for (;;) {
          let c = 'P';
          for (let k = 0; k < 4; k++) c += CODE_ALPHABET[Math.floor(rnd() * CODE_ALPHABET.length)];
          if (!codes.has(c)) {
            codes.add(c);
            return c;
          }
        }
      };
      const collecting = spec.state === 'collecting';
      for (const [li, labId] of labIds.entries()) {
        const enrolment = await em.save(
          Enrolment,
          em.create(Enrolment, {
            roundId: round.id,
            organisationId: labId,
            participantCode: drawCode(),
            extensionUntil: li === LATE_LAB ? addDays(new Date(spec.dueAt), 7) : null,
          }),
        );
        const dispatched = addDays(new Date(spec.dueAt), -40);
        await em.insert(Shipment, {
          enrolmentId: enrolment.id,
          courier: 'Overnight cold-chain courier',
          trackingNumber: `RL${spec.code.replace(/\W/g, '')}${String(li + 1).padStart(3, '0')}`,
          dispatchedOn: isoDate(dispatched),
          receivedOn:
            collecting && li % 7 === 5 ? null : isoDate(addDays(dispatched, 2 + (li % 3))),
          condition:
            collecting && li % 7 === 5 ? null : li === 17 && collecting ? 'arrived-warm' : 'intact',
          receiptNotes:
            li === 17 && collecting ? 'Cool pack thawed; items at about 18 °C on arrival.' : null,
        });
        // In the collecting round: most labs submitted, some hold drafts, the late lab nothing yet.
        const submits = !collecting || (li !== LATE_LAB && li % 4 !== 3);
        const drafts = collecting && li % 4 === 3;
        if (!submits && !drafts) continue;
        const data = labResults(
          spec,
          li,
          items.map((x) => x.id),
          measurands.map((x) => x.id),
          {
            bias: labBias[li]!,
            noise: labNoise[li]!,
            normal,
            instrument: INSTRUMENTS[li % INSTRUMENTS.length]!,
          },
        );
        // (in the collecting round every submission lies before "today")
        const submittedAt = collecting
          ? addDays(now, -1 - (li % 9) - 0.1 * (li % 5))
          : addDays(new Date(spec.dueAt), li === LATE_LAB ? 3 : -5 - (li % 9));
        const sub = await em.save(
          Submission,
          em.create(Submission, {
            enrolmentId: enrolment.id,
            state: submits ? 'submitted' : 'draft',
            draft: data as unknown as Record<string, unknown>,
            draftRevision: 1,
            currentVersion: submits ? 1 : 0,
            submittedAt: submits ? submittedAt : null,
          }),
        );
        if (submits) {
          await em.query(
            `INSERT INTO submission_version (submission_id, version, data, submitted_by, note, is_late, submitted_at)
             VALUES ($1, 1, $2, NULL, NULL, $3, $4)`,
            [sub.id, JSON.stringify(data), li === LATE_LAB, submittedAt],
          );
        }
      }
      return round.id;
    });
    if (spec.state === 'published') {
      await computeDraft(ctx, actor, roundId, {});
      await commitEvaluation(ctx, actor, roundId);
      await publishEvaluation(ctx, actor, roundId);
      // The story happened in the past: the round was evaluated and published three weeks after the due date.
      // Back-dating a published evaluation passes its immutability trigger only for this demo load:
      // the seed runs as the owner role, which may switch the table's trigger off inside this one
      // transaction (the server's runtime role cannot). Run as any other role, the dates stay "now".
      const at = addDays(new Date(spec.dueAt), 21);
      await ds
        .transaction(async (em) => {
          await em.query(`ALTER TABLE evaluation DISABLE TRIGGER evaluation_published_immutable`);
          await em.query(
            `UPDATE evaluation SET computed_at = $2, committed_at = $2, published_at = $2, created_at = $2 WHERE round_id = $1`,
            [roundId, at],
          );
          await em.query(`ALTER TABLE evaluation ENABLE TRIGGER evaluation_published_immutable`);
          await em.query(
            `UPDATE investigation SET created_at = $2, updated_at = $2 WHERE round_id = $1`,
            [roundId, at],
          );
          await em.query(`UPDATE round_transition SET at = $2 WHERE round_id = $1`, [roundId, at]);
        })
        .catch(() => undefined);
    }
  }
  await ds.transaction(async (em) => {
    await storyInvestigations(em, labIds[LAB1]!, addDays(new Date(ROUNDS[2]!.dueAt), 33));
    await instrumentChecks(em, labIds, rnd, now);
    await grants(em, labIds, now);
  });
  await seedPrecisionStudy(ds, ctx, actor, scheme.id, labIds, now);
  await seedDemoBilling(ds, labIds, now);
}

/** One lab's results for a round, with the story's blunders written in. */
function labResults(
  spec: RoundSpec,
  li: number,
  itemIds: string[],
  measurandIds: string[],
  lab: { bias: number; noise: number; normal: () => number; instrument: string },
): SubmissionData {
  const temperatureC = 25;
  return {
    items: spec.items.map((it, ii) => {
      let z = it.trueZ * (1 + lab.bias + 0.01 * lab.normal());
      let pdi = Math.max(0.005, it.truePdi * (1 + 0.15 * lab.normal()));
      let viscosity = 0.89;
      let note = '';
      if (spec.story === 'blunders') {
        if (li === RADIUS_LAB && ii === 0) z = z / 2; // the hydrodynamic radius, reported as a diameter
        if (li === DUST_LAB && ii === 1) {
          z *= 1.24; // aggregates and dust inflate the mean …
          pdi = 0.26; // … and the PDI
          note = 'Sample measured straight from the vial; no filtration of the diluent.';
        }
        if (li === LAB1 && ii === 1) {
          z *= 1.1254; // analysed at 20 °C viscosity while the cell was at 25 °C
          viscosity = 1.0016;
        }
      }
      const reps = (centre: number, rel: number, decimals: number) =>
        [0, 1, 2].map(() => round(centre * (1 + rel * lab.normal()), decimals));
      return {
        testItemId: itemIds[ii]!,
        results: [
          {
            measurandId: measurandIds[0]!,
            replicates: reps(z, lab.noise, 1),
            uncertainty:
              li % 3 === 0 ? { kind: 'expanded' as const, value: round(0.03 * z, 1), k: 2 } : null,
          },
          { measurandId: measurandIds[1]!, replicates: reps(pdi, 0.08, 3), uncertainty: null },
        ],
        conditions: {
          instrument: lab.instrument,
          laserWavelengthNm: lab.instrument.includes('532')
            ? 532
            : lab.instrument.includes('658')
              ? 658
              : 633,
          scatteringAngleDeg:
            lab.instrument.includes('90°') && !lab.instrument.includes('173') ? 90 : 173,
          temperatureC,
          equilibrationMin: 2 + (li % 4),
          dispersant: it.material.includes('NaCl') ? '10 mM NaCl' : 'water',
          viscosityMPas: viscosity,
          refractiveIndex: 1.332,
          dilution: '1:100 in filtered dispersant',
          filterPoreUm: 0.2,
          cuvette: li % 2 === 0 ? 'disposable polystyrene, 10 mm' : 'quartz, 10 mm',
        },
        methodNotes: note,
      };
    }),
    acknowledgedWarnings: [],
    explanation: '',
  };
}

/** Aldergrove has started on its action signal; an older investigation of another lab is closed. */
async function storyInvestigations(
  em: EntityManager,
  lab1Id: string,
  closedAt: Date,
): Promise<void> {
  const open = await em.find(Investigation, { where: { organisationId: lab1Id, state: 'open' } });
  for (const inv of open) {
    await em.update(
      Investigation,
      { id: inv.id },
      {
        causeCategory: 'dispersant',
        rootCause:
          'The analysis used the viscosity of water at 20 °C while the cell was held at 25 °C.',
        correctiveAction:
          'SOP updated to read the viscosity from the measured cell temperature; results re-analysed.',
      },
    );
  }
  const others = await em.find(Investigation, {
    where: { state: 'open' },
    order: { createdAt: 'ASC' },
    take: 2,
  });
  for (const inv of others.filter((i) => i.organisationId !== lab1Id).slice(0, 1)) {
    await em.update(
      Investigation,
      { id: inv.id },
      {
        causeCategory: 'sample-preparation',
        rootCause: 'Diluent was not filtered; dust in the cuvette.',
        correctiveAction:
          'Diluent now filtered through 0.2 µm; cuvettes rinsed with filtered water.',
        effectivenessCheck: 'Repeat of the retained sample within 2 % of the assigned value.',
        state: 'closed',
        closedAt,
      },
    );
  }
}

/** A history of instrument checks for every lab; the dust lab has one failure. */
async function instrumentChecks(
  em: EntityManager,
  labIds: string[],
  rnd: () => number,
  now: Date,
): Promise<void> {
  const rows = [];
  for (const [li, labId] of labIds.entries()) {
    // about eight and a half months, two and a half months and twelve days before "today"
    for (const [k, daysAgo] of [257, 75, 12].entries()) {
      const when = addDays(now, -daysAgo);
      when.setUTCHours(9, 0, 0, 0);
      const failing = li === DUST_LAB && k === 0;
      const spec = {
        referenceValueNm: 100,
        toleranceNm: 2,
        pdiLimit: 0.05,
        setPointC: 25,
        temperatureToleranceC: 0.5,
        minEquilibrationMin: 2,
      };
      const runs = [0, 1, 2].map(() => ({
        zAverageNm: round(failing ? 109 + 4 * rnd() : 100 + 2.4 * (rnd() - 0.5), 1),
        pdi: round(failing ? 0.09 + 0.04 * rnd() : 0.015 + 0.02 * rnd(), 3),
        temperatureC: 25,
        equilibrationMin: 3,
      }));
      const verdict = judgeInstrumentCheck({ ...spec, runs });
      rows.push({
        organisationId: labId,
        instrument: INSTRUMENTS[li % INSTRUMENTS.length]!,
        material: 'Polystyrene reference latex, certified 100 nm (invented certificate)',
        ...spec,
        runs,
        passed: verdict.passed,
        verdict: verdict as unknown as Record<string, unknown>,
        notes: failing ? 'Cuvette holder not cleaned after the previous user.' : '',
        checkedAt: when,
        recordedBy: null,
      });
    }
  }
  await em.insert(InstrumentCheck, rows as never);
}

/** The assessor may read Aldergrove's and Birchmere's records from eleven months ago to seven months ahead. */
async function grants(em: EntityManager, labIds: string[], now: Date): Promise<void> {
  const assessor = await em.findOneByOrFail(User, { email: 'assessor@ringlet.example' });
  for (const labId of labIds.slice(0, 2)) {
    await em.insert(AssessorGrant, {
      organisationId: labId,
      assessorId: assessor.id,
      grantedBy: null,
      startsOn: isoDate(addDays(now, -335)),
      endsOn: isoDate(addDays(now, 210)),
    });
  }
}

function addDays(d: Date, days: number): Date {
  return new Date(d.getTime() + days * 86400000);
}
function isoDate(d: Date): string {
  return d.toISOString().slice(0, 10);
}
function round(v: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(v * f) / f;
}

export type { Organisation };
