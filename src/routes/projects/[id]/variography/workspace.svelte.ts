import type { DomainSamples, ProjectApi, VariogramView, ZonationView } from '$lib/api';
import { CancelledError } from '$lib/cancelled-error';
import {
	defaultSettings,
	lagTableCsv,
	parametersFromModel,
	type ExperimentalResult,
	type ModelParameters,
	type Progress,
	type VariogramSettings
} from '$lib/variography';
import type { VariographyEngine } from './engine';
import { VariogramHistory } from './history.svelte';
import { ModelEditor } from './model-editor.svelte';
import { Notices } from './notices.svelte';

/** Settings edits are computed this long after the last keystroke. */
const DEBOUNCE_MS = 300;

/**
 * The variography workspace of a project: the chosen domain and its samples, the experimental settings and
 * the variograms computed from them (in the engine's worker, with progress and cancel), the model being
 * fitted (`model`) and the saved versions (`history`). Pages and components read its state and call its
 * methods; it knows nothing of the page's URL or markup.
 *
 * Flow: choosing a domain loads its samples and saved versions, puts the newest version (or default
 * settings) in place and computes; every settings edit recomputes after a pause; a new result or new
 * parameters are evaluated again. Answers that arrive for a domain no longer shown are dropped.
 */
export class VariographyWorkspace {
	readonly notices = new Notices();
	readonly model: ModelEditor;
	readonly history: VariogramHistory;

	zonations = $state<ZonationView[]>([]);
	zonationId = $state('');
	domainId = $state('');
	/** The chosen domain's samples, weights and statistics. */
	data = $state.raw<DomainSamples | null>(null);
	/** Experimental settings, edited in place by the settings panel (then call settingsEdited()). */
	settings = $state<VariogramSettings | null>(null);
	result = $state.raw<ExperimentalResult | null>(null);
	/** The domain and settings (JSON) the shown result was computed for. */
	resultFor = $state('');
	resultSettings = $state('');
	progress = $state<Progress | null>(null);
	running = $state(false);
	loading = $state(true);

	readonly zonation = $derived(this.zonations.find((z) => z.id === this.zonationId) ?? null);
	readonly minPairs = $derived(this.settings?.minPairs ?? 30);
	/** The y-axis label: γ of the normal scores (dimensionless) or of the values (unit squared). */
	readonly valueLabel = $derived.by(() => {
		if (!this.data || !this.settings) return 'γ(h)';
		const { label, unit } = this.data.property;
		if (this.settings.transform === 'normal-score') return `γ(h) of normal scores of ${label} (–)`;
		return `γ(h) of ${label} (${unit === '–' || unit === '' ? '–' : `${unit}²`})`;
	});
	/** "zonation-domain", lower case, for file names. */
	readonly fileBase = $derived(
		`${this.zonation?.name ?? 'zonation'}-${this.data?.domain.name ?? 'domain'}`
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-|-$/g, '')
	);

	private engine: VariographyEngine | null = null;
	private timer: ReturnType<typeof setTimeout> | undefined;
	/** JSON of the settings last sent to the engine. */
	private lastKey = '';
	private evaluations = 0;

	constructor(
		private readonly api: ProjectApi,
		private readonly startEngine: () => VariographyEngine,
		private readonly onDomain: (domainId: string) => void = () => {}
	) {
		this.model = new ModelEditor(() => this.evaluate());
		this.history = new VariogramHistory(api, this.notices, (v) => this.loadSaved(v));
	}

	/** Starts the engine and loads the zonations; opens `wanted` when it is a domain, else the first domain. */
	async start(wanted: string | null): Promise<void> {
		this.engine = this.startEngine();
		try {
			this.zonations = await this.api.zonations();
			const has = (z: ZonationView) => z.domains.some((d) => d.id === wanted);
			const z = this.zonations.find(has) ?? this.zonations.find((zz) => zz.domains.length > 0);
			if (z) {
				this.zonationId = z.id;
				await this.selectDomain(has(z) ? wanted! : z.domains[0].id);
			}
		} catch (err) {
			this.notices.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}

	destroy(): void {
		clearTimeout(this.timer);
		this.engine?.terminate();
		this.engine = null;
	}

	async selectZonation(id: string): Promise<void> {
		this.zonationId = id;
		const z = this.zonations.find((zz) => zz.id === id);
		if (z?.domains.length) await this.selectDomain(z.domains[0].id);
	}

	async selectDomain(id: string): Promise<void> {
		this.domainId = id;
		this.onDomain(id);
		this.notices.clear();
		this.result = null;
		this.model.evaluation = null;
		this.model.params = null;
		this.history.close();
		try {
			const [samples, versions] = await Promise.all([this.api.domainSamples(id), this.api.variograms(id)]);
			if (this.domainId !== id) return;
			this.data = samples;
			this.history.reset(id, versions, samples.domain.name);
			if (versions.length > 0) this.loadSaved(versions[0]);
			else this.settings = samples.samples.value.length > 0 ? defaultSettings(samples) : null;
			if (this.settings) await this.compute();
			else this.notices.problem = 'This domain has no samples yet.';
		} catch (err) {
			this.notices.problem = (err as Error).message;
		}
	}

	/** Puts a saved version's settings and model into the workspace. */
	loadSaved(v: VariogramView): void {
		const { transform, declustered, vertical, horizontal, minPairs, fit } = v.settings;
		this.settings = { transform, declustered, vertical: { ...vertical }, horizontal: { ...horizontal }, minPairs };
		if (fit) this.model.useFitRequest(fit);
		let params: ModelParameters | null;
		try {
			params = parametersFromModel(v.model);
		} catch {
			params = null;
		}
		this.model.set(params);
		this.history.saveName = v.name;
		this.notices.status = `Loaded ${v.name} v${v.version}.`;
		this.settingsEdited();
	}

	/** Call after any edit of `settings`: the variograms are computed again after a pause, unless nothing changed. */
	settingsEdited(): void {
		const key = this.settings ? JSON.stringify(this.settings) : '';
		if (!key || !this.data || key === this.lastKey) return;
		clearTimeout(this.timer);
		this.timer = setTimeout(() => void this.compute(), DEBOUNCE_MS);
	}

	/** Computes both experimental variograms of the current settings now (a job still running is cancelled). */
	async compute(): Promise<void> {
		const engine = this.engine;
		if (!engine || !this.data || !this.settings) return;
		const snapshot = $state.snapshot(this.settings) as VariogramSettings;
		const key = JSON.stringify(snapshot);
		this.lastKey = key;
		clearTimeout(this.timer);
		this.running = true;
		this.notices.problem = '';
		this.progress = { done: 0, total: 1, stage: 'starting' };
		const forDomain = this.domainId;
		try {
			const r = await engine.variograms({ samples: this.data.samples, weights: this.data.weights }, snapshot, (p) => (this.progress = p));
			if (forDomain !== this.domainId) return;
			this.result = r;
			this.resultFor = forDomain;
			this.resultSettings = key;
			this.notices.status = '';
			this.evaluate();
		} catch (err) {
			if (!(err instanceof CancelledError)) this.notices.problem = (err as Error).message;
			else if (forDomain === this.domainId && this.lastKey === key) this.notices.status = 'Cancelled. Change a setting or press Compute to run again.';
		} finally {
			if (this.lastKey === key) this.running = false;
		}
	}

	cancel(): void {
		this.engine?.cancel();
		this.running = false;
	}

	/** Weighted least-squares fit of the current structure and nugget choice to both directions' bins. */
	async autoFit(): Promise<void> {
		if (!this.engine || !this.result || !this.settings) return;
		this.model.fitting = true;
		this.notices.problem = '';
		try {
			const fit = await this.engine.fit(
				{ vertical: this.result.vertical, horizontal: this.result.horizontal },
				{ ...this.model.fitRequest, minPairs: this.settings.minPairs, azimuth: this.settings.horizontal.azimuth ?? 0 }
			);
			this.model.set(fit.parameters);
			this.notices.status = 'Automatic fit done (weighted least squares, Cressie weights).';
		} catch (err) {
			this.notices.problem = `The automatic fit failed: ${(err as Error).message}`;
		} finally {
			this.model.fitting = false;
		}
	}

	/** A model to fit by hand: no nugget, the sill at the variance, ranges a third of each direction's lag span. */
	startManual(): void {
		if (!this.result || !this.settings) return;
		const { vertical, horizontal } = this.settings;
		this.model.set({
			type: this.model.type,
			nugget: 0,
			sill: this.result.variance || 1,
			rangeVertical: (vertical.lag * vertical.nLags) / 3,
			rangeHorizontal: (horizontal.lag * horizontal.nLags) / 3,
			azimuth: horizontal.azimuth ?? 0
		});
	}

	/** Misfit and range sensitivity of the model against the bins (the latest request wins). */
	evaluate(): void {
		const { params, model } = this.model;
		const n = ++this.evaluations;
		if (!this.engine || !this.result || !params || !model) {
			this.model.evaluation = null;
			return;
		}
		this.engine
			.evaluate($state.snapshot(params) as ModelParameters, { vertical: this.result.vertical, horizontal: this.result.horizontal }, this.minPairs)
			.then((e) => {
				if (n === this.evaluations) this.model.evaluation = { misfit: e.misfit, sensitivity: e.sensitivity };
			})
			.catch(() => {
				if (n === this.evaluations) this.model.evaluation = null;
			});
	}

	/** Saves the model with the settings, the fit request and the data's context as a new version. */
	async save(): Promise<void> {
		const { params, model, evaluation } = this.model;
		if (!params || !model || !this.settings || !this.data) return;
		await this.history.save({
			model,
			settings: {
				...($state.snapshot(this.settings) as VariogramSettings),
				fit: { ...this.model.fitRequest, type: params.type },
				property: this.data.property.key,
				samples: this.data.samples.value.length
			},
			misfit: evaluation?.misfit.total?.perBin ?? null
		});
	}

	/** One direction's lag table as CSV, with the model's γ when there is a model. */
	lagCsv(direction: 'vertical' | 'horizontal'): string | null {
		if (!this.result || !this.settings || !this.data) return null;
		return lagTableCsv(this.result[direction], {
			lag: this.settings[direction].lag,
			lengthUnit: this.data.lengthUnit,
			model: this.model.curves?.[direction]
		});
	}
}
