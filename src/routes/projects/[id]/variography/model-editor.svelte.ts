import { modelCurves, modelFromParameters, type FitRequest, type ModelParameters } from '$lib/variography';
import type { Evaluation } from './engine';

/** How the automatic fit treats the nugget: fitted, left out, or held at `nuggetFixed`. */
export type NuggetMode = 'fit' | 'none' | 'fixed';

/** The parameters a user edits directly (the structure type has its own setter). */
export type EditableParameter = 'nugget' | 'sill' | 'rangeVertical' | 'rangeMajor' | 'rangeMinor';

/** A plot's direction: vertical, horizontal along the azimuth (major), or across it (minor). */
export type PlotDirection = 'vertical' | 'horizontal' | 'minor';

/**
 * The model being fitted: its parameters (from the automatic fit, a saved version, a start by hand, typed
 * or dragged on a plot), the analysed space they belong to, how the automatic fit is asked for, and the
 * latest misfit and range sensitivity. Every change of the parameters goes through set(), which tells the
 * workspace to evaluate them again.
 */
export class ModelEditor {
	/** The edited parameters; null until a fit, a load or a start by hand. */
	params = $state<ModelParameters | null>(null);
	/**
	 * The analysed space (domain, transform, weights, trend) the parameters were fitted or typed in; a model
	 * is only drawn, evaluated and saved against bins of the same space.
	 */
	space = $state('');
	/** Structure of the automatic fit (and of the parameters, once there are some). */
	type = $state<ModelParameters['type']>('exponential');
	nuggetMode = $state<NuggetMode>('fit');
	nuggetFixed = $state(0);
	/** The automatic fit holds the total sill at the variance of what is analysed, or fits it freely. */
	sillMode = $state<'variance' | 'fit'>('variance');
	/** True while the bins have no direction across the azimuth (2D, omnidirectional): rangeMinor follows rangeMajor. */
	isotropic = $state(true);
	fitting = $state(false);
	/** Misfit and sensitivity of the current parameters against the current bins; null while unknown. */
	evaluation = $state.raw<Evaluation | null>(null);

	/** The engine model of the parameters; null while they do not make one (a sill below the nugget, a range of 0). */
	readonly model = $derived.by(() => {
		if (!this.params) return null;
		try {
			return modelFromParameters(this.params);
		} catch {
			return null;
		}
	});

	constructor(private readonly changed: () => void) {}

	/** γ(h) of the model vertically, along a plan azimuth and across it, for the plots and lag tables. */
	curvesAlong(azimuth: number | null) {
		return this.model ? modelCurves(this.model, azimuth ?? this.model.azimuth) : null;
	}

	/** The automatic fit as the controls ask for it. */
	get fitRequest(): FitRequest {
		return { type: this.type, nugget: this.nuggetMode === 'fixed' ? this.nuggetFixed : this.nuggetMode, sill: this.sillMode };
	}

	/** Takes the controls back to a fit request saved with a model (versions saved before the sill choice were fitted freely). */
	useFitRequest(fit: FitRequest): void {
		this.type = fit.type;
		this.nuggetMode = typeof fit.nugget === 'number' ? 'fixed' : fit.nugget;
		if (typeof fit.nugget === 'number') this.nuggetFixed = fit.nugget;
		this.sillMode = fit.sill ?? 'fit';
	}

	/** Replaces the parameters (null clears the model) in an analysed space, and has them evaluated. */
	set(params: ModelParameters | null, space: string = this.space): void {
		this.params = params;
		this.space = params ? space : '';
		if (params) this.type = params.type;
		this.changed();
	}

	/** A new structure type: for the next fit, and for the current parameters if there are some. */
	setType(type: ModelParameters['type']): void {
		this.type = type;
		if (this.params) this.set({ ...this.params, type });
	}

	/** A typed value; ignored unless it is a finite number (the input keeps showing what was typed). */
	setValue(key: EditableParameter, value: number): void {
		if (!this.params || !Number.isFinite(value)) return;
		const next = { ...this.params, [key]: value };
		if (key === 'rangeMajor' && this.isotropic) next.rangeMinor = value;
		this.set(next);
	}

	/** A handle dragged on a plot: a range of that direction, the sill (not below the nugget) or the nugget (not above the sill). */
	drag(direction: PlotDirection, c: { range?: number; sill?: number; nugget?: number }): void {
		if (!this.params) return;
		const next = { ...this.params };
		if (c.range !== undefined) {
			if (direction === 'vertical') next.rangeVertical = c.range;
			else if (direction === 'minor') next.rangeMinor = c.range;
			else {
				next.rangeMajor = c.range;
				if (this.isotropic) next.rangeMinor = c.range;
			}
		}
		if (c.sill !== undefined) next.sill = Math.max(c.sill, next.nugget);
		if (c.nugget !== undefined) next.nugget = Math.min(c.nugget, next.sill);
		this.set(next);
	}
}
