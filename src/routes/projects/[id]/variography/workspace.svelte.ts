import type { DomainSamples, ProjectApi, VariogramView, ZonationView } from '$lib/api';
import { CancelledError } from '$lib/cancelled-error';
import {
	defaultSettings,
	lagTableCsv,
	parametersFromModel,
	type ExperimentalResult,
	type MapAnisotropy,
	type ModelParameters,
	type Progress,
	type VariogramSettings
} from '$lib/variography';
import type { VariographyEngine } from './engine';
import { VariogramHistory } from './history.svelte';
import { ModelEditor } from './model-editor.svelte';
import { Notices } from './notices.svelte';
import { analysedSpace, describeSpace } from './analysed-space';

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
 *
 * Stale state: a model belongs to the analysed space it was fitted in (analysedSpace). When a result of
 * another space arrives (the transform, the weights or the trend changed), the model is dropped and the
 * automatic fit runs again on the new bins; until then nothing draws, compares or saves a model against bins
 * of another space.
 */
export class VariographyWorkspace {
	readonly notices = new Notices();
	readonly model = new ModelEditor(() => this.evaluate());
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
	/** Set when the loaded version was fitted to other samples than the domain has now; cleared by a new fit. */
	dataChanged = $state('');
	/** The direction of greatest continuity last read off the map (3D). */
	mapFit = $state.raw<MapAnisotropy | null>(null);
	findingDirection = $state(false);

	readonly zonation = $derived(this.zonations.find((z) => z.id === this.zonationId) ?? null);
	/** The settings the shown result was computed with (the edited settings may be ahead of it). */
	readonly shownSettings = $derived<VariogramSettings | null>(this.resultSettings ? (JSON.parse(this.resultSettings) as VariogramSettings) : null);
	readonly minPairs = $derived(this.shownSettings?.minPairs ?? this.settings?.minPairs ?? 30);
	/** The analysed space of the shown result ('' without one). */
	readonly resultSpace = $derived(this.shownSettings && this.resultFor ? analysedSpace(this.resultFor, this.shownSettings) : '');
	/** Whether the model belongs to the shown bins' space: only then is it drawn, evaluated and saved. */
	readonly modelMatches = $derived(!!this.model.params && this.model.space !== '' && this.model.space === this.resultSpace);
	/** γ(h) of the model along the shown result's directions, or null when there is no model of this space. */
	readonly curves = $derived(this.modelMatches ? this.model.curvesAlong(this.shownSettings?.horizontal.azimuth ?? null) : null);
	/** The y-axis label: γ of the normal scores (dimensionless) or of the values (unit squared), of residuals with a trend. */
	readonly valueLabel = $derived.by(() => {
		const s = this.shownSettings ?? this.settings;
		if (!this.data || !s) return 'γ(h)';
		const { label, unit } = this.data.property;
		const of = s.trend && s.trend !== 'none' ? `residuals of ${label}` : label;
		if (s.transform === 'normal-score') return `γ(h) of normal scores of ${of} (–)`;
		return `γ(h) of ${of} (${unit === '–' || unit === '' ? '–' : `${unit}²`})`;
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
		this.resultFor = '';
		this.resultSettings = '';
		this.mapFit = null;
		this.dataChanged = '';
		this.model.evaluation = null;
		this.model.params = null;
		this.model.space = '';
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
		const { transform, declustered, trend, vertical, horizontal, minPairs, fit } = v.settings;
		this.settings = { transform, declustered, trend, vertical: { ...vertical }, horizontal: { ...horizontal }, minPairs };
		if (fit) this.model.useFitRequest(fit);
		let params: ModelParameters | null;
		try {
			params = parametersFromModel(v.model);
		} catch {
			params = null;
		}
		this.model.set(params, analysedSpace(this.domainId, this.settings));
		this.history.saveName = v.name;
		this.notices.status = `Loaded ${v.name} v${v.version}.`;
		const now = this.data?.samples.value.length;
		const then = v.settings.samples;
		// The domain's data may have changed since (its rules, contacts or soundings): say so rather than let an old fit pass.
		this.dataChanged =
			then !== undefined && now !== undefined && then !== now
				? `${v.name} v${v.version} was fitted to ${then} samples; the domain now has ${now} (its rules, contacts or soundings changed). Fit again before relying on it.`
				: '';
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
			const data = { samples: this.data.samples, weights: this.data.weights, geometry: this.data.geometry };
			const r = await engine.variograms(data, snapshot, (p) => (this.progress = p));
			if (forDomain !== this.domainId) return;
			const before = this.shownSettings;
			this.result = r;
			this.resultFor = forDomain;
			this.resultSettings = key;
			this.notices.status = '';
			this.model.isotropic = r.horizontalMinor === null;
			if (this.model.params && this.model.space !== this.resultSpace) await this.refitInNewSpace(before);
			else this.evaluate();
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

	/**
	 * A result of another analysed space arrived while a model of the old one is held: the model is dropped
	 * and the automatic fit runs on the new bins, and the status says why.
	 */
	private async refitInNewSpace(before: VariogramSettings | null): Promise<void> {
		const now = this.shownSettings!;
		this.model.set(null);
		const fitted = await this.autoFit();
		const from = before ? describeSpace(before) : 'another domain';
		this.notices.status = fitted
			? `The analysed values changed (${from} → ${describeSpace(now)}): the old model was dropped and the automatic fit run on the new bins.`
			: `The analysed values changed (${from} → ${describeSpace(now)}): the old model was dropped.`;
	}

	/**
	 * Weighted least-squares fit of the current structure, nugget and sill choice to the shown bins (vertical,
	 * horizontal and, with a direction in plan, across it), the sill held at the variance of what is analysed
	 * unless freed. Returns whether a model was fitted.
	 */
	async autoFit(): Promise<boolean> {
		const s = this.shownSettings;
		const r = this.result;
		if (!this.engine || !r || !s) return false;
		const space = this.resultSpace;
		this.model.fitting = true;
		this.notices.problem = '';
		try {
			const request = this.model.fitRequest;
			const fit = await this.engine.fit(
				{ vertical: r.vertical, horizontal: r.horizontal, horizontalMinor: r.horizontalMinor },
				{ ...request, minPairs: s.minPairs, azimuth: s.horizontal.azimuth ?? 0, variance: r.variance }
			);
			if (space !== this.resultSpace) return false;
			this.model.set(fit.parameters, space);
			this.dataChanged = '';
			this.notices.status =
				request.sill === 'fit'
					? 'Automatic fit done (weighted least squares, Cressie weights), sill fitted freely.'
					: `Automatic fit done (weighted least squares, Cressie weights), total sill held at the variance ${figureOf(r.variance)}.`;
			return true;
		} catch (err) {
			this.notices.problem = `The automatic fit failed: ${(err as Error).message}`;
			return false;
		} finally {
			this.model.fitting = false;
		}
	}

	/** A model to fit by hand: no nugget, the sill at the variance, ranges a third of each direction's lag span. */
	startManual(): void {
		const s = this.shownSettings;
		if (!this.result || !s) return;
		const { vertical, horizontal } = s;
		const h = (horizontal.lag * horizontal.nLags) / 3;
		this.model.set(
			{
				type: this.model.type,
				nugget: 0,
				sill: this.result.variance || 1,
				rangeVertical: (vertical.lag * vertical.nLags) / 3,
				rangeMajor: h,
				rangeMinor: h,
				azimuth: horizontal.azimuth ?? 0
			},
			this.resultSpace
		);
	}

	/**
	 * Reads the direction of greatest continuity off the map (3D) with the current structure, nugget and sill
	 * (or none and the variance), and computes the variograms along it and across it.
	 */
	async useMapDirection(): Promise<void> {
		const r = this.result;
		if (!this.engine || !r?.map || !this.settings) return;
		this.findingDirection = true;
		this.notices.problem = '';
		try {
			const p = this.modelMatches && this.model.params ? this.model.params : { type: this.model.type, nugget: 0, sill: r.variance };
			const fit = await this.engine.anisotropy(r.map, { type: p.type, nugget: p.nugget, sill: p.sill }, this.minPairs);
			this.mapFit = fit;
			this.settings.horizontal.azimuth = fit.azimuth;
			this.notices.status = `The map's direction of greatest continuity is ${fit.azimuth}° (ranges about ${figureOf(fit.rangeMajor)} along and ${figureOf(fit.rangeMinor)} across); the variograms are computed along and across it.`;
			await this.compute();
		} catch (err) {
			this.notices.problem = `No direction found: ${(err as Error).message}`;
		} finally {
			this.findingDirection = false;
		}
	}

	/** Misfit and range sensitivity of the model against the bins of its own space (the latest request wins). */
	evaluate(): void {
		const { params, model } = this.model;
		const n = ++this.evaluations;
		const r = this.result;
		if (!this.engine || !r || !params || !model || !this.modelMatches) {
			this.model.evaluation = null;
			return;
		}
		this.engine
			.evaluate($state.snapshot(params) as ModelParameters, { vertical: r.vertical, horizontal: r.horizontal, horizontalMinor: r.horizontalMinor }, this.minPairs)
			.then((e) => {
				if (n === this.evaluations) this.model.evaluation = { misfit: e.misfit, sensitivity: e.sensitivity };
			})
			.catch(() => {
				if (n === this.evaluations) this.model.evaluation = null;
			});
	}

	/**
	 * Saves the model with the settings of the bins it was evaluated against, the fit request and the data's
	 * context as a new version. Refused (nothing sent) when the model is not of the shown bins' space.
	 */
	async save(): Promise<void> {
		const { params, model, evaluation } = this.model;
		const s = this.shownSettings;
		if (!params || !model || !s || !this.data || !this.modelMatches) return;
		await this.history.save({
			model,
			settings: {
				...s,
				fit: { ...this.model.fitRequest, type: params.type },
				property: this.data.property.key,
				samples: this.data.samples.value.length
			},
			misfit: evaluation?.misfit.total?.perBin ?? null
		});
	}

	/** One direction's lag table as CSV, with the model's γ when there is a model of this space. */
	lagCsv(direction: 'vertical' | 'horizontal' | 'minor'): string | null {
		const s = this.shownSettings;
		const bins = direction === 'minor' ? this.result?.horizontalMinor : this.result?.[direction];
		if (!bins || !s || !this.data) return null;
		return lagTableCsv(bins, {
			lag: s[direction === 'vertical' ? 'vertical' : 'horizontal'].lag,
			lengthUnit: this.data.lengthUnit,
			model: this.curves?.[direction]
		});
	}
}

function figureOf(v: number): string {
	return String(Number(v.toPrecision(3)));
}
