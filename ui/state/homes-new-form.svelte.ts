/**
 * The New home form: a home's name, job state, client (one of the project's, or a new one),
 * address and house, kept as typed until the store accepts it, so a refusal loses nothing.
 * The screen turns text into numbers (in the project's units) and says when a box is empty;
 * every other rule is the store's, and its words are shown beside the box they are about.
 */
import { call } from '../bridge.ts';
import type { ChannelRequest } from '../../electron/channels.ts';
import { HOUSE_FIELDS, type HouseFieldKey } from '../house-fields.ts';
import { storedValue, type UnitSystem } from '../quantities.ts';
import { parseNumber, sentence } from '../text.ts';

type HomeInput = ChannelRequest<'homes.create'>;

/** The boxes of the form that are not the house's. */
const HOME_PATHS = {
  name: 'name',
  jobStatus: 'jobStatus',
  client: 'clientId',
  street: 'address.street',
  town: 'address.town',
  region: 'address.region',
  postalCode: 'address.postalCode',
  notes: 'notes',
} as const;

/** The boxes of a new client, and the clients.create fields they fill. */
const CLIENT_PATHS = { clientName: 'name', clientPhone: 'phone', clientEmail: 'email' } as const;

type AddressKey = 'street' | 'town' | 'region' | 'postalCode';
export type NewHomeKey = keyof typeof HOME_PATHS | keyof typeof CLIENT_PATHS | HouseFieldKey;

/** The client box's value for "a new client"; otherwise '' (none) or a client's id. */
export const NEW_CLIENT = 'new';

export type FormStatus =
  { kind: 'idle' } | { kind: 'working'; words: string } | { kind: 'refused'; words: string };

const HOUSE_KEYS = HOUSE_FIELDS.map((field) => field.key);

function emptyDraft(): Record<NewHomeKey, string> {
  const house = Object.fromEntries(HOUSE_KEYS.map((key) => [key, ''])) as Record<
    HouseFieldKey,
    string
  >;
  return {
    name: '',
    jobStatus: 'audited',
    client: '',
    clientName: '',
    clientPhone: '',
    clientEmail: '',
    street: '',
    town: '',
    region: '',
    postalCode: '',
    ...house,
    notes: '',
  };
}

/** The form's box a problem of a homes.create reply is about, if any. */
function keyOfHomePath(path: string): NewHomeKey | undefined {
  const house = /^data\.house\.([A-Za-z0-9]+)/.exec(path);
  if (house !== null) return HOUSE_KEYS.find((key) => key === house[1]);
  return (Object.keys(HOME_PATHS) as (keyof typeof HOME_PATHS)[]).find(
    (key) => path === HOME_PATHS[key] || path.startsWith(`${HOME_PATHS[key]}.`),
  );
}

export class NewHomeForm {
  draft = $state<Record<NewHomeKey, string>>(emptyDraft());
  /** Whether anything is typed that is not saved as a home yet. */
  hasUnsaved = $derived.by(() => {
    const empty = emptyDraft();
    return (Object.keys(empty) as NewHomeKey[]).some((key) => this.draft[key] !== empty[key]);
  });
  errors = $state<Partial<Record<NewHomeKey, string>>>({});
  status = $state<FormStatus>({ kind: 'idle' });
  units = $state<UnitSystem>('IP');
  clients = $state.raw<readonly { id: number; name: string }[]>([]);
  /** The name of a client this form added to the project (on a try the store then refused). */
  addedClient = $state<string | null>(null);
  /** Why the project's clients or units could not be read, if they could not. */
  loadFailure = $state<string | null>(null);

  /** The project's discount rate and ranking, which a new home starts from. */
  #economics: NonNullable<HomeInput['data']['economics']> | null = null;

  /** Reads the project's clients, units, discount rate and ranking. */
  async prepare(): Promise<void> {
    const [clients, settings] = await Promise.all([
      call('clients.list', {}),
      call('settings.get', {}),
    ]);
    if (settings.ok) {
      this.units = settings.value.units;
      this.#economics = {
        discountRateReal: settings.value.discountRateReal,
        ranking: settings.value.ranking,
      };
    }
    if (clients.ok) {
      this.clients = clients.value.map((client) => ({ id: client.id, name: client.name }));
    }
    const failed = [clients, settings].find((reply) => !reply.ok);
    this.loadFailure = failed !== undefined && !failed.ok ? failed.error.message : null;
  }

  edit(key: NewHomeKey, text: string): void {
    this.draft[key] = text;
  }

  /** Empties the form (after the home was made, or when it is put away). */
  reset(): void {
    this.draft = emptyDraft();
    this.errors = {};
    this.status = { kind: 'idle' };
    this.addedClient = null;
  }

  /** The keys of the boxes with a problem, in the form's order, so the page can go to the first. */
  invalidKeys(): NewHomeKey[] {
    return (Object.keys(this.draft) as NewHomeKey[]).filter((key) => this.errors[key]);
  }

  /** The house from its boxes, in stored units, or what keeps a box from giving a value. */
  #house(problems: Partial<Record<NewHomeKey, string>>): Record<string, number | string> {
    const house: Record<string, number | string> = {};
    for (const field of HOUSE_FIELDS) {
      const text = this.draft[field.key].trim();
      if (field.kind === 'choice') {
        if (text === '') problems[field.key] = `Choose the ${field.label.toLowerCase()}.`;
        else house[field.key] = field.key === 'shelterClass' ? Number(text) : text;
        continue;
      }
      const value = parseNumber(text);
      if (text === '') problems[field.key] = `Enter the ${field.label.toLowerCase()}.`;
      else if (value === null) {
        problems[field.key] = 'Enter a number, in digits (such as 1850 or 7.5).';
      } else {
        house[field.key] =
          field.quantity === undefined ? value : storedValue(field.quantity, value, this.units);
      }
    }
    return house;
  }

  /** The homes.create request the form describes, or the problems the screen itself sees. */
  #input(): { input: HomeInput } | { problems: Partial<Record<NewHomeKey, string>> } {
    const problems: Partial<Record<NewHomeKey, string>> = {};
    if (this.draft.name.trim() === '') problems.name = 'Enter a name for the home.';
    if (this.draft.client === NEW_CLIENT && this.draft.clientName.trim() === '') {
      problems.clientName = 'Enter the new client’s name.';
    }
    const house = this.#house(problems);
    if (Object.keys(problems).length > 0) return { problems };
    const address: Partial<Record<AddressKey, string>> = {};
    for (const key of ['street', 'town', 'region', 'postalCode'] as const) {
      const text = this.draft[key].trim();
      if (text !== '') address[key] = text;
    }
    const input: HomeInput = {
      name: this.draft.name.trim(),
      jobStatus: this.draft.jobStatus as HomeInput['jobStatus'],
      data: {
        house: house as unknown as NonNullable<HomeInput['data']['house']>,
        // A new home starts from the project's analysis settings and the simplest
        // infiltration model; the House section's Analysis panel changes either.
        ...(this.#economics === null ? {} : { economics: this.#economics }),
        infiltrationMethod: 'nFactor',
      },
    };
    if (Object.keys(address).length > 0) input.address = address;
    const notes = this.draft.notes.trim();
    if (notes !== '') input.notes = notes;
    return { input };
  }

  /** Adds the new client the form names; true when there is one to link (or none was asked). */
  async #clientOfDraft(): Promise<boolean> {
    if (this.draft.client !== NEW_CLIENT) return true;
    const request: ChannelRequest<'clients.create'> = { name: this.draft.clientName.trim() };
    const phone = this.draft.clientPhone.trim();
    const email = this.draft.clientEmail.trim();
    if (phone !== '') request.phone = phone;
    if (email !== '') request.email = email;
    const reply = await call('clients.create', request);
    if (!reply.ok) {
      const errors: Partial<Record<NewHomeKey, string>> = {};
      for (const problem of reply.error.problems ?? []) {
        const key = (Object.keys(CLIENT_PATHS) as (keyof typeof CLIENT_PATHS)[]).find(
          (candidate) => problem.path === CLIENT_PATHS[candidate],
        );
        errors[key ?? 'client'] ??= sentence(problem.message);
      }
      if (Object.keys(errors).length === 0) errors.client = sentence(reply.error.message);
      this.errors = errors;
      this.status = { kind: 'refused', words: 'Not saved: the new client was refused.' };
      return false;
    }
    // The client now exists: the form links it from here on, so a refused home cannot add it twice.
    const name = request.name;
    this.clients = [...this.clients, { id: reply.value.id, name }].sort((a, b) =>
      a.name.localeCompare(b.name),
    );
    this.draft.client = String(reply.value.id);
    this.addedClient = name;
    this.draft.clientName = '';
    this.draft.clientPhone = '';
    this.draft.clientEmail = '';
    return true;
  }

  /**
   * Makes the home the form describes.
   *
   * @returns its id, or null when the screen or the store refused (each box keeps its text)
   */
  async submit(): Promise<number | null> {
    if (this.status.kind === 'working') return null;
    const made = this.#input();
    if ('problems' in made) {
      this.errors = made.problems;
      this.status = { kind: 'refused', words: 'Not saved: see the marked boxes.' };
      return null;
    }
    this.status = { kind: 'working', words: `Making ${made.input.name}…` };
    if (!(await this.#clientOfDraft())) return null;
    const clientId = this.draft.client === '' ? null : Number(this.draft.client);
    const reply = await call('homes.create', { ...made.input, clientId });
    if (!reply.ok) {
      const errors: Partial<Record<NewHomeKey, string>> = {};
      const unplaced: string[] = [];
      for (const problem of reply.error.problems ?? []) {
        const key = keyOfHomePath(problem.path);
        if (key === undefined) unplaced.push(problem.message);
        else errors[key] ??= sentence(problem.message);
      }
      if (reply.error.field === 'clientId' && errors.client === undefined) {
        errors.client = sentence(reply.error.message);
      }
      this.errors = errors;
      const rest =
        unplaced.length > 0
          ? unplaced.join('; ')
          : Object.keys(errors).length === 0
            ? reply.error.message
            : '';
      this.status = {
        kind: 'refused',
        words: `Not saved: ${rest === '' ? 'see the marked boxes.' : sentence(rest)}`,
      };
      return null;
    }
    this.reset();
    return reply.value.id;
  }
}
