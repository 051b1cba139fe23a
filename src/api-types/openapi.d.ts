/**
 * The API's request and response shapes, generated from openapi/openapi.json by
 * openapi-typescript (`npm run openapi:generate`; checked by `npm run openapi:check`).
 * Never edited by hand: change the route schemas in src/api and regenerate.
 */
export type paths = {
    "/healthz": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Liveness: the process answers
         * @description Checks nothing else (no storage, no Redis), so an outage of a dependency never gets a healthy process restarted.
         */
        get: operations["getLiveness"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/readyz": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /** Readiness: storage and queue connections answer */
        get: operations["getReadiness"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/metrics": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Prometheus metrics (text exposition format)
         * @description Sweeps by status count every owner's sweeps, so on a server with tokens only an admin token may read them (others get 403); give the scraper an admin token.
         */
        get: operations["getMetrics"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/openapi.json": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /** This API's OpenAPI 3.1 document */
        get: operations["getOpenApiDocument"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * List your sweeps (an admin: any owner's), newest first
         * @description Cursor pagination: follow `nextCursor` (or the Link header's rel="next" URL, which keeps the filters) until it is null. An admin lists every owner's sweeps with `owner=*`, or one owner's with `owner=<name>`.
         */
        get: operations["listSweeps"];
        put?: never;
        /**
         * Submit a sweep
         * @description Validates the spec, checks it against the work limits before anything is allocated, and queues it. Answers 202 with the status, a Location header and Retry-After; follow progress at /events or by polling the status. When the answer is a sweep that has already finished (a repeated Idempotency-Key of a finished sweep, or ?reuse=true finding identical results), it is 200 with that sweep's final status instead: no waiting needed.
         */
        post: operations["submitSweep"];
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/validate": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        get?: never;
        put?: never;
        /**
         * Check a spec without running it
         * @description Returns the normalised spec, its hash, the number of points and trials, and estimates of peak memory and CPU time, plus the first work limit it would exceed. Nothing is queued.
         */
        post: operations["validateSweep"];
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Status and progress of one sweep
         * @description Carries a weak ETag that changes only when the sweep does: poll with If-None-Match to get 304 until something happens.
         */
        get: operations["getSweep"];
        put?: never;
        post?: never;
        /**
         * Cancel a sweep, or remove a finished one
         * @description Stops a queued or running sweep (running trials stop within about a second) and answers 202 with its record; what it stored stays (partial results, resume). A sweep that has already ended cannot be canceled: 409 MEMSWEEP_SWEEP_FINISHED, and nothing changes. With ?purge=true a finished sweep is removed for good, with its stored chunks and results (204; its owner only; irreversible); an active one is not (409 MEMSWEEP_SWEEP_ACTIVE: cancel it first). The request needs no body; one that is sent is read like any (JSON, within the body limit) and ignored.
         */
        delete: operations["cancelSweep"];
        options?: never;
        head?: never;
        /**
         * Change a sweep's label, tags or notes
         * @description Describes a sweep for finding it again (?tag=, ?q= on the list); the work and results do not change. Owner (or admin) with a submit role.
         */
        patch: operations["annotateSweep"];
        trace?: never;
    };
    "/v1/sweeps/{id}/extend": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        get?: never;
        put?: never;
        /**
         * Extend a sweep: more trials, more values on any axis
         * @description Creates a new sweep (its `extends` names this one) whose spec is this sweep's with more trials per point and/or more values on any varied parameter. Every trial this sweep stored (even if it was canceled) is taken, not computed again; only what is missing runs. Its rows equal, byte for byte, those of a fresh run of the extended spec, because every trial draws from a stream keyed by the seed, the point's parameters and the trial's index. Answers like a submission (202, or 200 when nothing is left to compute).
         */
        post: operations["extendSweep"];
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/resume": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        get?: never;
        put?: never;
        /**
         * Resume a canceled or failed sweep
         * @description Lets a canceled or failed sweep run on under the same id: every chunk it stored is kept, only the rest is computed. 409 MEMSWEEP_NOT_RESUMABLE for a sweep in any other state.
         */
        post: operations["resumeSweep"];
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/results": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Results of a succeeded sweep (JSON, CSV or Apache Arrow)
         * @description JSON by default; CSV with `Accept: text/csv` or `?format=csv`; an Apache Arrow IPC file with `Accept: application/vnd.apache.arrow.file` or `?format=arrow` (the CSV's table with typed columns; docs/data-dictionary.md lists every column). Every CSV and Arrow row starts with sweepId, specHash, seed, the point and every model parameter, varied or fixed, in one column order. One row per grid point with the varied parameters, aggregated measures with uncertainties and the theory values that apply; `?trials=true` for per-trial rows; `?series=trajectory` for the mean trajectories per point (long-format CSV, or JSON). An analysis (threshold search) gives `searches` (and `scaling` when asked for) in JSON; its CSV has one row per search, or with `?trials=true` one row per evaluated step (searches keep per-step summaries, not per-trial records; scaling fits are JSON-only). A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 422 (limit maxTrialRows) for per-trial rows of sweeps over a million trials.
         */
        get: operations["getSweepResults"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/events": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Follow a sweep live (Server-Sent Events)
         * @description A text/event-stream. Events, each with an increasing `id:`:
         *     - `snapshot` (first): the SweepStatus as GET /v1/sweeps/{id} returns it (without the spec);
         *     - `progress`: the SweepStatus after more trials finished (at most about 4 per second);
         *     - `state`: the SweepStatus after a change of status; after a terminal one (succeeded, failed, canceled) the server closes the stream.
         *     Every stream ends with that terminal `state` event: for a sweep that had already ended, the stream is its `snapshot`, then its `state`, then the close.
         *     Lines starting with `:` are heartbeats (`: ping`). A reconnecting client gets a fresh snapshot.
         */
        get: operations["streamSweepEvents"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/theory": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        get?: never;
        put?: never;
        /**
         * Theory values at every grid point of a spec, without simulating
         * @description Which values exist depends on the model: e.g. Hebbian ±1 networks with unbiased patterns get the replica-symmetric critical load and retrieval overlap, the one-step crosstalk error, first-step overlaps for parallel dynamics; the pseudo-inverse rule gets its critical load. Each value is given only inside its domain; elsewhere `theoryUnavailable` names the reason. For an analysis (threshold search) each search is evaluated at both ends of its range. Nothing is simulated, but the spec must pass the same work limits as submitting it (422 naming the limit), so any spec answered here can be submitted.
         */
        post: operations["evaluateTheory"];
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/figure.svg": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * A figure of a succeeded sweep (SVG)
         * @description A measure against one varied parameter, one series per value of the others, 95 % error bars, theory overlaid where it applies, lines named at their ends or in a legend; readable in black and white (house style and options: docs/figures.md). A standalone SVG document; every point carries its numbers as data-x, data-y, data-low, data-high attributes. A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 400 naming the option when an option is malformed, 422 naming it when the options do not fit this sweep (for example an x it does not vary).
         */
        get: operations["getSweepFigure"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/figures/overlay.svg": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Several succeeded sweeps overlaid in one figure (SVG)
         * @description The figure of /v1/sweeps/{id}/figure.svg for up to 8 sweeps at once: each sweep in its own colour, each combination of its other varied parameters with its own marker, named by the sweep label shortened (or sweepNames) and the parameter values; x must be varied by every sweep. For comparing, for example, two learning rules' capacity curves. 404 if any sweep is unknown, 409 if any has not succeeded, 422 naming the option if the options do not fit them.
         */
        get: operations["getOverlayFigure"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/figure.png": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * A figure of a succeeded sweep (PNG)
         * @description A measure against one varied parameter, one series per value of the others, 95 % error bars, theory overlaid where it applies, lines named at their ends or in a legend; readable in black and white (house style and options: docs/figures.md). The SVG figure drawn as PNG by resvg with the shipped typeface (Source Sans 3), the same pixels on every machine; dpi sets the resolution. A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 400 naming the option when an option is malformed, 422 naming it when the options do not fit this sweep (for example an x it does not vary).
         */
        get: operations["getSweepFigurePng"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/figures/overlay.png": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Several succeeded sweeps overlaid in one figure (PNG)
         * @description The figure of /v1/sweeps/{id}/figure.png for up to 8 sweeps at once: each sweep in its own colour, each combination of its other varied parameters with its own marker, named by the sweep label shortened (or sweepNames) and the parameter values; x must be varied by every sweep. For comparing, for example, two learning rules' capacity curves. 404 if any sweep is unknown, 409 if any has not succeeded, 422 naming the option if the options do not fit them.
         */
        get: operations["getOverlayFigurePng"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/figure.pdf": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * A figure of a succeeded sweep (PDF)
         * @description A measure against one varied parameter, one series per value of the others, 95 % error bars, theory overlaid where it applies, lines named at their ends or in a legend; readable in black and white (house style and options: docs/figures.md). The SVG figure as a vector PDF (pdfkit with svg-to-pdfkit) with the shipped typeface embedded; the page is the figure's size. A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 400 naming the option when an option is malformed, 422 naming it when the options do not fit this sweep (for example an x it does not vary).
         */
        get: operations["getSweepFigurePdf"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/figures/overlay.pdf": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Several succeeded sweeps overlaid in one figure (PDF)
         * @description The figure of /v1/sweeps/{id}/figure.pdf for up to 8 sweeps at once: each sweep in its own colour, each combination of its other varied parameters with its own marker, named by the sweep label shortened (or sweepNames) and the parameter values; x must be varied by every sweep. For comparing, for example, two learning rules' capacity curves. 404 if any sweep is unknown, 409 if any has not succeeded, 422 naming the option if the options do not fit them.
         */
        get: operations["getOverlayFigurePdf"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
    "/v1/sweeps/{id}/bundle.zip": {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        /**
         * Supplementary-material bundle of a succeeded sweep (zip)
         * @description One zip with a folder `memsweep-<id>/` holding README.md (what each file is and how to reproduce the numbers with one command), `spec.json`, `spec.normalised.json`, `results.json`, `results.csv`, `results.arrow`, `trials.csv`, `trajectory.csv`, `figure.svg`, `figure.pdf`, `figure.png`, `provenance.json`. Files that do not apply to the sweep are left out and the README says why (per-trial rows above 200,000 trials, trajectories the spec does not record, the figure of a threshold search). A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded.
         */
        get: operations["getSweepBundle"];
        put?: never;
        post?: never;
        delete?: never;
        options?: never;
        head?: never;
        patch?: never;
        trace?: never;
    };
};
export type webhooks = Record<string, never>;
export type components = {
    schemas: {
        CrossingFit: {
            /**
             * @description logistic-profile: local logistic regression of the success counts, profile-likelihood interval; local-linear-fieller: weighted line through the mean overlaps nearest the crossing, Fieller interval.
             * @enum {string}
             */
            method: "logistic-profile" | "local-linear-fieller";
            estimate: number | null;
            low: number | null;
            high: number | null;
            /** @description Slope of the fitted curve at the crossing, per unit of the parameter (logit units for success, overlap units for overlap). */
            slope: number | null;
            /** @description The success counts switched from all to none between two neighbouring steps (a step sharper than the data resolve). */
            separated: boolean;
            /** @description Pearson χ² per degree of freedom of the fit; above 1 the interval was widened by it. */
            dispersion: number | null;
        };
        /** @description One offending field. A path, pointer or message longer than 256 characters (an unknown key that long, say) is cut and ends in … */
        FieldIssue: {
            /** @description Dotted path of the offending field, e.g. `grid.load.to` or `patterns.data[3]`; empty for the whole body. */
            path: string;
            /** @description The same location as a JSON Pointer (RFC 6901), e.g. `/grid/load/to`. */
            pointer: string;
            message: string;
        };
        Liveness: {
            /** @constant */
            status: "ok";
        };
        MeanWithError: {
            mean: number | null;
            /** @description Sample standard deviation over trials. */
            sd: number | null;
            /** @description Standard error of the mean. */
            se: number | null;
        };
        PointSummary: {
            trials: number;
            /** @description Final overlap with the target pattern. */
            overlap: components["schemas"]["MeanWithError"];
            /** @description Trials whose final overlap reached the success threshold. */
            success: {
                count: number;
                rate: number | null;
                /** @description Wilson 95 % interval, lower end. */
                low: number | null;
                /** @description Wilson 95 % interval, upper end. */
                high: number | null;
            };
            sweeps: components["schemas"]["MeanWithError"];
            maxOtherOverlap: components["schemas"]["MeanWithError"];
            /** @description Energy per neuron of the final state. */
            energy: components["schemas"]["MeanWithError"];
            /** @description How the dynamics ended: fixed point, 2-cycle, sweep limit, or sampled (T > 0). */
            endings: {
                fixed: number;
                cycle2: number;
                max: number;
                sampled: number;
            };
            /** @description Trials per end-state class of the final state (T > 0: of the time-averaged overlaps). `target`: overlap with the target m_t ≥ q (q: the pattern level, the success threshold in spec format 2); `reversed`: overlap with the target m_t ≤ −|q|: the reversed pattern −ξ^t; `otherPattern`: some other pattern ν has |m_ν| ≥ |q|: another stored pattern (or its reverse); `symmetricMixture`: an odd number k ≥ 3 of macroscopic overlaps, each |m_ν| within δ_k of the symmetric k-mixture value m_k(T) (Amit, Gutfreund & Sompolinsky 1985); `partialTarget`: the target is the only macroscopic overlap, |m_t| < |q|: a retrieval state below the pattern level (finite temperature) or a remanent overlap past capacity; `spurious`: macroscopic overlaps that fit none of the above: asymmetric mixtures, a lone partial overlap with another pattern; `spinGlass`: no macroscopic overlap with any stored pattern (every |m_ν| below the state's macroscopic level): spin-glass-like. */
            endStates: {
                target: number;
                reversed: number;
                otherPattern: number;
                symmetricMixture: number;
                partialTarget: number;
                spurious: number;
                spinGlass: number;
            };
            /** @description One-step stability of the stored patterns (when measured). */
            stability: {
                networks: number;
                /** @description Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern. */
                unstableFraction: number | null;
                /** @description Fraction with h_i = 0 exactly (kept by the tie rule). */
                tieFraction: number | null;
                /** @description Fraction of stored patterns that are exact fixed points. */
                fixedPatternFraction: number | null;
                /** @description Sample standard deviation of each fraction over networks. */
                sd: {
                    /** @description Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern. */
                    unstableFraction: number | null;
                    /** @description Fraction with h_i = 0 exactly (kept by the tie rule). */
                    tieFraction: number | null;
                    /** @description Fraction of stored patterns that are exact fixed points. */
                    fixedPatternFraction: number | null;
                };
                /** @description Standard error of each mean over networks (sd/√networks). */
                se: {
                    /** @description Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern. */
                    unstableFraction: number | null;
                    /** @description Fraction with h_i = 0 exactly (kept by the tie rule). */
                    tieFraction: number | null;
                    /** @description Fraction of stored patterns that are exact fixed points. */
                    fixedPatternFraction: number | null;
                };
            } | null;
            /** @description T > 0 only: the mean over trials of the fraction of measured sweeps (after burn-in) spent in each class. */
            endStateShares?: {
                target: number | null;
                reversed: number | null;
                otherPattern: number | null;
                symmetricMixture: number | null;
                partialTarget: number | null;
                spurious: number | null;
                spinGlass: number | null;
            };
            /** @description T > 0 only: trials per class of the state after the last sweep. */
            finalEndStates?: {
                target: number;
                reversed: number;
                otherPattern: number;
                symmetricMixture: number;
                partialTarget: number;
                spurious: number;
                spinGlass: number;
            };
            /** @description T > 0 only: the largest other overlap of the state after the last sweep (maxOtherOverlap is its time average). */
            finalMaxOtherOverlap?: components["schemas"]["MeanWithError"];
            /** @description T > 0 only: the energy of the state after the last sweep (energy is its time average). */
            finalEnergy?: components["schemas"]["MeanWithError"];
            /** @description Mixture cues only: the overlap with each component, target first (final; T > 0: time-averaged). */
            componentOverlaps?: components["schemas"]["MeanWithError"][];
            /** @description With measures.overlapTrajectory: the mean target overlap after each sweep, sweep 0 being the cue. */
            overlapTrajectory?: components["schemas"]["TrajectorySummary"];
            /** @description With measures.energyTrajectory: the mean energy after each sweep, from sweep 1. */
            energyTrajectory?: components["schemas"]["TrajectorySummary"];
            /** @description Overlaps between the stored patterns of each network (measures.patternOverlaps). */
            patternOverlaps?: {
                networks: number;
                /** @description Pairs μ < ν per network. */
                pairs: number;
                /** @description Mean of C_μν = (1/N) ξ^μ·ξ^ν over the pairs, averaged over networks. */
                mean: components["schemas"]["MeanWithError"];
                /** @description Mean |C| over the pairs. */
                meanAbs: components["schemas"]["MeanWithError"];
                /** @description Root mean square of C over the pairs. */
                rms: components["schemas"]["MeanWithError"];
                /** @description Largest |C| over the pairs. */
                maxAbs: components["schemas"]["MeanWithError"];
                /** @description What the pattern family implies; null where it implies nothing (supplied patterns) or no closed form is given. */
                expected: {
                    /** @description Expected mean C: (2a − 1)² for random patterns of activity a; for correlated families q² over same-parent pairs, 0 over the others, averaged over the pairs. */
                    mean: number | null;
                    /** @description √(expected mean C²): 1/√N for independent unbiased patterns. */
                    rms: number | null;
                    /** @description Expected mean |C| (independent unbiased patterns only, exact binomial). */
                    meanAbs: number | null;
                    /** @description Median of the largest |C| over the pairs (independent unbiased patterns only; pairs treated as independent). */
                    maxAbs: number | null;
                };
            };
        };
        /** @description RFC 9457 problem details. */
        Problem: {
            /** @description URI naming the problem type: `urn:memsweep:problem:<code in kebab case>`. */
            type: string;
            title: string;
            status: number;
            detail: string;
            /** @description The request path the problem occurred on. */
            instance: string;
            /**
             * @description Stable machine-readable code; see docs/errors.md.
             * @enum {string}
             */
            code: "MEMSWEEP_MALFORMED_REQUEST" | "MEMSWEEP_UNAUTHENTICATED" | "MEMSWEEP_FORBIDDEN" | "MEMSWEEP_OWNER_ONLY" | "MEMSWEEP_ROUTE_NOT_FOUND" | "MEMSWEEP_SWEEP_NOT_FOUND" | "MEMSWEEP_NOT_ACCEPTABLE" | "MEMSWEEP_RESULTS_NOT_READY" | "MEMSWEEP_RESULTS_UNAVAILABLE" | "MEMSWEEP_SWEEP_FINISHED" | "MEMSWEEP_SWEEP_ACTIVE" | "MEMSWEEP_NOT_RESUMABLE" | "MEMSWEEP_BODY_TOO_LARGE" | "MEMSWEEP_UNSUPPORTED_MEDIA_TYPE" | "MEMSWEEP_SPEC_INVALID" | "MEMSWEEP_WORK_LIMIT_EXCEEDED" | "MEMSWEEP_IDEMPOTENCY_KEY_REUSED" | "MEMSWEEP_CALLBACK_REFUSED" | "MEMSWEEP_FIGURE_OPTIONS_UNFIT" | "MEMSWEEP_RATE_LIMITED" | "MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS" | "MEMSWEEP_TOO_MANY_AUTH_FAILURES" | "MEMSWEEP_INTERNAL" | "MEMSWEEP_NOT_READY";
            /** @description Request id, also sent as the X-Request-Id header; quote it in bug reports. */
            requestId: string;
            /** @description One entry per invalid field (validation problems only), at most 100. */
            errors?: components["schemas"]["FieldIssue"][];
            /** @description Present with `errors`: how many further issues were found but not listed (errors[] lists at most 100); 0 when errors[] lists them all. */
            errorsOmitted?: number;
            /** @description The work limit a sweep exceeds (MEMSWEEP_WORK_LIMIT_EXCEEDED only). */
            limit?: {
                name: string;
                value: number;
                max: number;
            };
            /** @description The sweep the problem is about, when there is one. */
            sweepId?: string;
            /** @description Seconds to wait before retrying (also sent as Retry-After). */
            retryAfter?: number;
        };
        /** @description Where and how the result was computed: fixed by the spec and the code, so repeated or interrupted runs give the same bytes. The run timing (which differs between runs) appears only with ?timing=true. */
        Provenance: {
            specHash: string;
            engineVersion: string;
            node: string;
            v8: string;
            rng: string;
            /** @description How a grid point's random streams are keyed: by a hash of the point's model parameters, not its position in the grid, so sweeps that share a point (an extension, a new grid) draw the same trials there. */
            pointKeying: string;
            /**
             * @description The T = 0 tie rule of the dynamics: `keep` means a neuron whose local field is exactly zero keeps its state. Exact theory values derived under random tie-breaking say so in their names (…TiesRandom).
             * @enum {string}
             */
            tieRule: "keep";
            /** @description Only with ?timing=true: wall-clock seconds from the first chunk started to the last one finished. */
            wallSeconds?: number;
            /** @description Only with ?timing=true: CPU seconds summed over all chunks. */
            cpuSeconds?: number;
            workers?: number;
            fastPath?: string;
        } & {
            [key: string]: unknown;
        };
        Readiness: {
            /** @constant */
            status: "ready";
            /** @enum {string} */
            backend: "embedded" | "redis";
        };
        ResultRow: {
            point: number;
            /** @description The varied parameters at this point, by path: numbers; a rule axis gives the rule's label (its kind, then its parameters not at their defaults, e.g. `dense-polynomial(degree=3)`), a self-coupling axis true or false. */
            values: {
                [key: string]: number | string | boolean;
            };
            params: {
                /** @description Realised load per neuron P/N. */
                alpha: number;
                neurons: number;
                patterns: number;
                /** @description Under a fixed in-degree K only: the realised load per input P/K, the load that matters there. */
                inDegreeLoad?: number;
            };
            summary: components["schemas"]["PointSummary"];
            /** @description Theory values that hold at this point, by name; {} when none does. */
            theory: {
                [key: string]: number | null;
            };
            /** @description The other theory values of the point's model, by name, each with the reason it is missing here (it is then an empty cell in CSV). Every value, its domain and its source: docs/theory.md. */
            theoryUnavailable: {
                [key: string]: components["schemas"]["TheoryUnavailableReason"];
            };
            /** @description With precision targets only (docs/workflow.md): how far this point's interval narrowed. */
            precision?: {
                /**
                 * @description The measure whose 95 % interval the target narrows.
                 * @enum {string}
                 */
                measure: "success" | "overlap";
                /** @description The half-width asked for (spec `precision.halfWidth`). */
                target: number;
                /** @description The half-width this point reached with its trials (`summary.trials`): Wilson's interval for success, 1.96·se for the overlap. */
                halfWidth: number;
                /** @description Whether the point reached the target; false when it stopped at the trial ceiling. */
                met: boolean;
            };
        };
        ScalingRow: {
            /** @description The varied parameters other than neurons shared by this fit's searches ({} when only N varies); a rule axis gives the rule's label. */
            values: {
                [key: string]: number | string | boolean;
            };
            /** @enum {string} */
            form: "power" | "linear-inverse";
            /** @description Weighted least-squares fit; null when too few sizes gave a bounded estimate (see note). */
            fit: {
                /** @enum {string} */
                form: "power" | "linear-inverse";
                /** @description x_∞, the extrapolation to N → ∞. */
                limit: {
                    value: number;
                    /** @description Standard error (null when fixed). */
                    se: number | null;
                };
                /** @description x_∞ ± z·se. */
                limitInterval: {
                    low: number;
                    high: number;
                    confidence: number;
                };
                /** @description a in x_∞ + a·N^(−b). */
                amplitude: {
                    value: number;
                    /** @description Standard error (null when fixed). */
                    se: number | null;
                };
                /** @description b (1 for linear-inverse); se null when fixed. */
                exponent: {
                    value: number;
                    /** @description Standard error (null when fixed). */
                    se: number | null;
                };
                /** @description Correlation of the estimates of x_∞ and a. */
                correlation: number | null;
                chiSquare: number;
                degreesOfFreedom: number;
                /** @description √max(1, χ²/dof): the factor already applied to every standard error. */
                errorScale: number;
            } | null;
            /** @description The estimates that entered the fit; se = interval width / 2z. */
            sizes: {
                search: number;
                neurons: number;
                estimate: number;
                se: number;
            }[];
            excluded: {
                search: number;
                neurons: number;
                reason: string;
            }[];
            /** @description Published values for the same quantity (the Hebbian capacity at T = 0, for a load search on that model); [] otherwise. */
            references: {
                /** @enum {string} */
                name: "rs-theory" | "finite-size-simulations";
                value: number;
                uncertainty: number | null;
                source: string;
                /** @description (x_∞ − value) / √(se² + uncertainty²). */
                deviation: number | null;
            }[];
            note: string | null;
        };
        SearchRow: {
            /** @description Index of the search: its point in the grid of the other varied parameters. */
            search: number;
            /** @description The other varied parameters of this search, by path (a rule axis gives the rule's label). */
            values: {
                [key: string]: number | string | boolean;
            };
            neurons: number;
            /** @description The fitted value of the searched parameter at which the measure crosses the level; null when the range holds no crossing or no fit was possible (see note). */
            estimate: number | null;
            /** @description Lower end of the confidence interval (analysis.confidence); null when the data do not bound it. */
            low: number | null;
            /** @description Upper end of the confidence interval; null when the data do not bound it. */
            high: number | null;
            /**
             * @description tolerance: bracket narrower than analysis.tolerance; noise: the level lay inside the latest step's interval with the bracket within 4 tolerances; resolution: the parameter cannot be split finer; max-steps: budget used up; no-crossing: the ends of the range do not straddle the level.
             * @enum {string}
             */
            stoppedBy: "tolerance" | "noise" | "resolution" | "max-steps" | "no-crossing";
            /** @description The last bracket of evaluated values straddling the level. */
            bracket: {
                low: number;
                high: number;
            } | null;
            fit: components["schemas"]["CrossingFit"] | null;
            /** @description A remark for the reader when the search needs one. */
            note: string | null;
            stepsUsed: number;
            trialsUsed: number;
            /** @description Every evaluated value, in evaluation order. */
            steps: components["schemas"]["SearchStep"][];
        };
        SearchStep: {
            /** @description Position in evaluation order (0 and 1 are the ends of the range). */
            step: number;
            /** @description Value of the searched parameter run at this step (a load is P/N for a whole P; a cue fraction a whole number of neurons over N). */
            value: number;
            /**
             * @description Whether the measure was at or above the level.
             * @enum {string}
             */
            side: "above" | "below";
            params: {
                alpha: number;
                neurons: number;
                patterns: number;
            };
            /** @description The step's trials aggregated as for a grid point. */
            summary: components["schemas"]["PointSummary"];
        };
        SpecValidation: {
            specHash: string;
            /** @description The normalised spec: every default filled in, every axis expanded to { values }. It is itself a valid spec. */
            spec: {
                [key: string]: unknown;
            };
            work: components["schemas"]["WorkEstimate"];
            /** @description This server's work limits. */
            limits: {
                maxNeurons: number;
                maxPoints: number;
                maxTrials: number;
                maxBytes: number;
                maxCpuSeconds: number | null;
                maxStoredBytes: number;
            };
            /** @description The first limit this sweep exceeds (submitting it would get 422), or null. */
            exceeded: {
                name: string;
                value: number;
                max: number;
            } | null;
        };
        Sweep: {
            id: string;
            status: components["schemas"]["SweepStatus"];
            label: string | null;
            /** @description Owner of the token that submitted the sweep; null on a server without tokens. */
            owner: string | null;
            /** @description sha256 of the canonical normalised spec: identical work has an identical hash. */
            specHash: string;
            /** @description ISO 8601 time of submission. */
            createdAt: string;
            startedAt: string | null;
            finishedAt: string | null;
            progress: components["schemas"]["SweepProgress"];
            /** @description Why the sweep failed; null unless status is failed. */
            error: components["schemas"]["SweepFailure"] | null;
            /** @description Id of the earlier identical sweep whose results this one reuses, if any. */
            reusedFrom: string | null;
            /** @description Id of the sweep this one extends (POST /v1/sweeps/{id}/extend), if any. */
            extends: string | null;
            /** @description What this sweep took from the owner's earlier sweeps (its parent, for an extension) instead of computing. */
            reused: {
                /** @description Grid points whose every trial planned at submission was taken from earlier sweeps of the owner instead of computed (with precision targets: the first block). */
                points: number;
                /** @description Trials taken from earlier sweeps of the owner (same model parameters, seed and trial index: exactly the records a fresh run computes), at submission and, with precision targets, in later blocks. */
                trials: number;
            };
            /** @description Tags to find the sweep by (PATCH to change; list with ?tag=). */
            tags: string[];
            /** @description Free notes (PATCH to change; searched by ?q=). */
            notes: string | null;
            /** @description sha256 of the spec without its seed and label: sweeps with the same key are replicates (list them with ?replicatesOf=<id>). */
            replicateKey: string;
            /** @description The completion callback asked for at submission (?callbackUrl=), and how its delivery goes; null without one. */
            callback: components["schemas"]["SweepCallback"] | null;
            links: {
                self: string;
                events: string;
                results: string;
            };
        };
        SweepAnnotationInput: {
            /** @description New label; null clears it. */
            label?: string | null;
            /** @description The sweep's tags (replaces the list). */
            tags?: string[];
            /** @description Free notes; null clears them. */
            notes?: string | null;
        };
        SweepCallback: {
            url: string;
            /**
             * @description waiting: the sweep has not ended; pending: the event of its end is due or being retried; delivered: the receiver answered 2xx; failed: every attempt failed.
             * @enum {string}
             */
            state: "waiting" | "pending" | "delivered" | "failed";
            /** @description Attempts made for the event of the last end. */
            attempts: number;
            /** @description What went wrong at the last failed attempt (e.g. "the receiver answered 500"); null after a success. */
            lastError: string | null;
        };
        SweepDetail: {
            id: string;
            status: components["schemas"]["SweepStatus"];
            label: string | null;
            /** @description Owner of the token that submitted the sweep; null on a server without tokens. */
            owner: string | null;
            /** @description sha256 of the canonical normalised spec: identical work has an identical hash. */
            specHash: string;
            /** @description ISO 8601 time of submission. */
            createdAt: string;
            startedAt: string | null;
            finishedAt: string | null;
            progress: components["schemas"]["SweepProgress"];
            /** @description Why the sweep failed; null unless status is failed. */
            error: components["schemas"]["SweepFailure"] | null;
            /** @description Id of the earlier identical sweep whose results this one reuses, if any. */
            reusedFrom: string | null;
            /** @description Id of the sweep this one extends (POST /v1/sweeps/{id}/extend), if any. */
            extends: string | null;
            /** @description What this sweep took from the owner's earlier sweeps (its parent, for an extension) instead of computing. */
            reused: {
                /** @description Grid points whose every trial planned at submission was taken from earlier sweeps of the owner instead of computed (with precision targets: the first block). */
                points: number;
                /** @description Trials taken from earlier sweeps of the owner (same model parameters, seed and trial index: exactly the records a fresh run computes), at submission and, with precision targets, in later blocks. */
                trials: number;
            };
            /** @description Tags to find the sweep by (PATCH to change; list with ?tag=). */
            tags: string[];
            /** @description Free notes (PATCH to change; searched by ?q=). */
            notes: string | null;
            /** @description sha256 of the spec without its seed and label: sweeps with the same key are replicates (list them with ?replicatesOf=<id>). */
            replicateKey: string;
            /** @description The completion callback asked for at submission (?callbackUrl=), and how its delivery goes; null without one. */
            callback: components["schemas"]["SweepCallback"] | null;
            links: {
                self: string;
                events: string;
                results: string;
            };
            /** @description The normalised spec: every default filled in, every axis expanded to { values }. It is itself a valid spec, so it can be resubmitted as is. */
            spec: {
                [key: string]: unknown;
            };
        };
        SweepExtensionInput: {
            /** @description Trials per point of the extension (at least the parent's). */
            trials?: number;
            /** @description Values to add, by varied parameter path (e.g. {"load": [0.13, 0.15]}); a parameter held constant becomes an axis of it and the new values. */
            add?: {
                [key: string]: number[];
            };
            /** @description Label of the new sweep. Default: the parent's. */
            label?: string | null;
            tags?: string[];
            notes?: string | null;
        };
        SweepFailure: {
            /**
             * @description user: the spec cannot be computed as given (change it); system: the infrastructure failed (retrying may help).
             * @enum {string}
             */
            kind: "user" | "system";
            message: string;
        };
        SweepList: {
            items: components["schemas"]["Sweep"][];
            /** @description Pass as `cursor` for the next page; null on the last page. The same URL is in the Link header (rel="next"). */
            nextCursor: string | null;
        };
        SweepProgress: {
            /** @description Grid points whose every trial is done. */
            pointsDone: number;
            pointsTotal: number;
            trialsDone: number;
            /** @description Trials planned so far: all of them, or with precision targets the blocks given to each point so far (it grows; never shrinks). */
            trialsTotal: number;
            chunksDone: number;
            chunksTotal: number;
            /** @description trialsDone / trialsTotal, 1 once succeeded. With precision targets trialsTotal grows block by block (a point takes another block until it meets its target), so the fraction is of the ceiling, pointsTotal × trials: it never goes back. */
            fraction: number;
            /** @description Seconds since the sweep started running (until it finished); null while queued. */
            elapsedSeconds: number | null;
            /** @description Rough estimate from the rate so far while running; 0 once finished; null when not yet known. */
            estimatedSecondsLeft: number | null;
        };
        SweepResult: {
            specHash: string;
            /** @description The normalised spec the result belongs to. */
            spec: {
                [key: string]: unknown;
            };
            /** @description One row per grid point, in grid order (the last axis varies fastest). Empty for an analysis: see `searches`. */
            rows: components["schemas"]["ResultRow"][];
            /** @description trials[point][trial], only with ?trials=true. Empty for an analysis, which keeps per-step summaries (in `searches`) instead. */
            trials?: components["schemas"]["TrialRecord"][][];
            /** @description Analysis specs only: one threshold search per point of the grid of the other varied parameters, in grid order. */
            searches?: components["schemas"]["SearchRow"][];
            /** @description Analysis specs with `analysis.scaling` only: one finite-size fit per combination of the varied parameters other than `neurons`. */
            scaling?: components["schemas"]["ScalingRow"][];
            provenance: components["schemas"]["Provenance"];
            /** @description Only in partial results (?partial=true on a sweep that has not succeeded): the rows are those of the points finished so far. */
            partial?: {
                pointsDone: number;
                pointsTotal: number;
            };
        };
        /**
         * Sweep spec
         * @description A sweep: a network model, a cue and dynamics, and the parameters to vary. Any numeric parameter may be a number or an axis ({ values } | { from, to, step } | { from, to, count, scale }); several axes form a grid (Cartesian product, axes in canonical order, first slowest).
         */
        SweepSpecInput: {
            /**
             * @description Spec format version: 1 or 2. Version 1 classifies end states with the pattern level 0.9 whatever the success threshold; version 2 uses the success threshold. Default: 2.
             * @default 2
             * @enum {number}
             */
            version: 1 | 2;
            /**
             * @description Free text to recognise the sweep by; not part of the work, so not part of the spec hash. Default: null.
             * @default null
             */
            label: string | null;
            /**
             * @description Master seed; with the rest of the spec it fixes every random draw. Default: 1.
             * @default 1
             */
            seed: number;
            /** @description N, the number of neurons. Required unless the patterns are supplied (then it is their length). */
            neurons?: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /** @description P, the number of stored patterns. Give exactly one of patterns and load (supplied patterns: at most one; default all rows). */
            patterns?: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /** @description Load α = P/N; each point stores P = round(α·N) patterns. Give exactly one of patterns, load and inDegreeLoad. */
            load?: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /** @description Load per input α_K = P/K under a fixed in-degree dilution: each point stores P = round(α_K·K) patterns, so an axis of K holds P/K fixed. Give exactly one of patterns, load and inDegreeLoad. */
            inDegreeLoad?: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /**
             * @description Neuron values: pm1 (−1/+1) or binary (0/1). Default: pm1.
             * @default pm1
             * @enum {string}
             */
            coding: "pm1" | "binary";
            /**
             * @description How the stored patterns are drawn. Default: { "kind": "random", "activity": 0.5 }.
             * @default {
             *       "kind": "random"
             *     }
             */
            family: {
                /** @constant */
                kind: "random";
                /**
                 * @description Probability that an entry is active (+1, or 1 in binary coding); 0.5 is unbiased. Default: 0.5.
                 * @default 0.5
                 */
                activity: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            } | {
                /** @constant */
                kind: "correlated";
                /** @description Number of parent patterns; stored pattern μ derives from parent μ mod parents. Required. */
                parents: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
                /** @description Expected overlap of a stored pattern with its parent (each entry re-drawn with probability 1 − parentOverlap). Required. */
                parentOverlap: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            } | {
                /** @constant */
                kind: "supplied";
                /** @description The patterns, data[μ][i], written in the chosen coding (pm1: −1/+1, binary: 0/1); every row has `neurons` entries. `patterns` (or `load`) may select the first P rows; default: all rows. */
                data: number[][];
            };
            /**
             * @description Learning rule that turns the patterns into couplings, or an axis of rules ({ "values": [rule, …] }). Default: { "kind": "hebbian", "selfCoupling": false }.
             * @default {
             *       "kind": "hebbian"
             *     }
             */
            rule: ({
                /** @constant */
                kind: "hebbian";
                /**
                 * @description Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.
                 * @default false
                 */
                selfCoupling: boolean | {
                    /** @description true, false or both, in the order given. */
                    values: boolean[];
                };
            } | {
                /** @constant */
                kind: "pseudo-inverse";
                /**
                 * @description Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.
                 * @default false
                 */
                selfCoupling: boolean | {
                    /** @description true, false or both, in the order given. */
                    values: boolean[];
                };
            } | {
                /** @constant */
                kind: "storkey";
                /**
                 * @description Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.
                 * @default false
                 */
                selfCoupling: boolean | {
                    /** @description true, false or both, in the order given. */
                    values: boolean[];
                };
            } | {
                /** @constant */
                kind: "covariance";
                /**
                 * @description Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.
                 * @default false
                 */
                selfCoupling: boolean | {
                    /** @description true, false or both, in the order given. */
                    values: boolean[];
                };
                /** @default null */
                threshold: (number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                }) | null;
            } | {
                /** @constant */
                kind: "clipped";
                /**
                 * @description Keep the diagonal couplings J_ii: true, false, or an axis { "values": [false, true] }. Default: false.
                 * @default false
                 */
                selfCoupling: boolean | {
                    /** @description true, false or both, in the order given. */
                    values: boolean[];
                };
            } | {
                /** @constant */
                kind: "dense-polynomial";
                /** @description Degree n of the interaction F(x) = xⁿ, an integer in [2, 30]; n = 2 runs the Hebbian network. Required. */
                degree: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            } | {
                /** @constant */
                kind: "dense-exponential";
            } | {
                /** @constant */
                kind: "modern-softmax";
                /** @description Inverse temperature β > 0 of the softmax update; the patterns have unit length. Required. */
                beta: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            }) | {
                /** @description The rules to compare, each a rule object as above with plain numbers for its parameters (no axes inside), distinct, in the order given. */
                values: ({
                    /** @constant */
                    kind: "hebbian";
                    /**
                     * @description Keep the diagonal couplings J_ii. Default: false.
                     * @default false
                     */
                    selfCoupling: boolean;
                } | {
                    /** @constant */
                    kind: "pseudo-inverse";
                    /**
                     * @description Keep the diagonal couplings J_ii. Default: false.
                     * @default false
                     */
                    selfCoupling: boolean;
                } | {
                    /** @constant */
                    kind: "storkey";
                    /**
                     * @description Keep the diagonal couplings J_ii. Default: false.
                     * @default false
                     */
                    selfCoupling: boolean;
                } | {
                    /** @constant */
                    kind: "covariance";
                    /**
                     * @description Keep the diagonal couplings J_ii. Default: false.
                     * @default false
                     */
                    selfCoupling: boolean;
                    /** @default null */
                    threshold: number | null;
                } | {
                    /** @constant */
                    kind: "clipped";
                    /**
                     * @description Keep the diagonal couplings J_ii. Default: false.
                     * @default false
                     */
                    selfCoupling: boolean;
                } | {
                    /** @constant */
                    kind: "dense-polynomial";
                    /** @description Degree n of the interaction F(x) = xⁿ, an integer in [2, 30]; n = 2 runs the Hebbian network. Required. */
                    degree: number;
                } | {
                    /** @constant */
                    kind: "dense-exponential";
                } | {
                    /** @constant */
                    kind: "modern-softmax";
                    /** @description Inverse temperature β > 0 of the softmax update; the patterns have unit length. Required. */
                    beta: number;
                })[];
            };
            /**
             * @description Dilution of the couplings. Default: null (fully connected).
             * @default null
             */
            dilution: ({
                /**
                 * @description Optional; random is the only dilution without a kind (the normalised form leaves it out).
                 * @constant
                 */
                kind?: "random";
                /** @description Fraction of couplings kept, in (0, 1]. Required. */
                keep: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
                /**
                 * @description Cut J_ij and J_ji together (true) or independently (false). Default: true.
                 * @default true
                 */
                symmetric: boolean;
            } | {
                /** @constant */
                kind: "fixed-in-degree";
                /** @description K, the inputs of every neuron (distinct other neurons, drawn independently per neuron), in [1, N − 1]; the load that matters is P/K (give it as `inDegreeLoad` to hold it fixed while K varies). Required. */
                inDegree: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            }) | null;
            /**
             * @description Initial state of each trial. Default: { "kind": "flip", "fraction": 0.1 }.
             * @default {
             *       "kind": "flip"
             *     }
             */
            cue: {
                /** @constant */
                kind: "flip";
                /**
                 * @description Fraction of neurons flipped (exactly round(fraction·N) distinct ones). Default: 0.1.
                 * @default 0.1
                 */
                fraction: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            } | {
                /** @constant */
                kind: "erase";
                /**
                 * @description Fraction of neurons erased (exactly round(fraction·N) distinct ones). Default: 0.1.
                 * @default 0.1
                 */
                fraction: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
                /**
                 * @description Erased neurons are set to 0 (neutral) or to fresh random values. Default: zero.
                 * @default zero
                 * @enum {string}
                 */
                fill: "zero" | "random";
            } | {
                /** @constant */
                kind: "random";
            } | {
                /** @constant */
                kind: "mixture";
                /**
                 * @description Number of consecutive stored patterns, from the target on, whose sign-mixture is the cue. Default: 3.
                 * @default 3
                 */
                components: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            };
            /**
             * @description Retrieval dynamics.
             * @default {}
             */
            dynamics: {
                /**
                 * @description async-random: one neuron at a time, fresh random order each sweep; async-sequential: index order; sync: all at once. Default: async-random.
                 * @default async-random
                 * @enum {string}
                 */
                update: "async-random" | "async-sequential" | "sync";
                /**
                 * @description Temperature T ≥ 0; 0 is deterministic, T > 0 is Glauber dynamics. Default: 0.
                 * @default 0
                 */
                temperature: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
                /**
                 * @description Upper bound on sweeps (sync: steps); at T > 0 the number of sweeps run. Default: 100.
                 * @default 100
                 */
                maxSweeps: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
                /**
                 * @description T > 0: sweeps discarded before time averages start. Default: 0.
                 * @default 0
                 */
                burnIn: number | {
                    /** @description Explicit axis values, used in the order given. */
                    values?: number[];
                    /** @description First value of a generated axis. */
                    from?: number;
                    /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                    to?: number;
                    /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                    step?: number;
                    /** @description Number of evenly spaced values from `from` to `to`, both included. */
                    count?: number;
                    /**
                     * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                     * @enum {string}
                     */
                    scale?: "linear" | "log";
                };
            };
            /**
             * @description Optional extra measurements.
             * @default {}
             */
            measures: {
                /**
                 * @description Record the target overlap after every sweep. Default: false.
                 * @default false
                 */
                overlapTrajectory: boolean;
                /**
                 * @description Record the energy per neuron after every sweep. Default: false.
                 * @default false
                 */
                energyTrajectory: boolean;
                /**
                 * @description Measure the one-step stability of every stored pattern, once per network. Default: false.
                 * @default false
                 */
                stability: boolean;
                /**
                 * @description Measure the overlaps between the stored patterns of every network (mean, mean |C|, rms, largest |C| over all pairs, beside what the pattern family implies); costs O(N·P²/2) per network. Default: false.
                 * @default false
                 */
                patternOverlaps: boolean;
            };
            /**
             * @description A trial succeeds when its final target overlap is at least this. Default: 0.9.
             * @default 0.9
             */
            successThreshold: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /**
             * @description Trials (recall attempts) per grid point; with an analysis, per evaluated value of the searched parameter. Default: 100.
             * @default 100
             */
            trials: number;
            /**
             * @description Consecutive trials that share one network (pattern set and couplings); 1 draws a new network for every trial. Default: 1.
             * @default 1
             */
            trialsPerNetwork: number | {
                /** @description Explicit axis values, used in the order given. */
                values?: number[];
                /** @description First value of a generated axis. */
                from?: number;
                /** @description Last value of a generated axis (reached exactly with `count`; with `step`, included when a whole number of steps lands on it). */
                to?: number;
                /** @description Distance between consecutive values (positive; the axis runs from `from` towards `to`). */
                step?: number;
                /** @description Number of evenly spaced values from `from` to `to`, both included. */
                count?: number;
                /**
                 * @description Spacing of a `count` axis. Default: linear. `log` spaces values evenly in log(value) and needs positive bounds.
                 * @enum {string}
                 */
                scale?: "linear" | "log";
            };
            /**
             * @description Random streams. keyed: a stream per network and per trial, keyed by the seed and the point's parameters (any trial re-runs alone; chunks run in parallel). canonical: one xoshiro256** stream seeded from `seed` through SplitMix64, drawn through the points in grid order and their trials in order, exactly as the shared benchmark's reference programs draw (docs/canonical-stream.md); the sweep runs as one sequential chunk. Default: keyed.
             * @default keyed
             * @enum {string}
             */
            streams: "keyed" | "canonical";
            /** @description Turns the sweep into an analysis (omit for a plain grid sweep). Threshold search: for every point of the grid of the other varied parameters, the value of `parameter` at which `measure` crosses `level`, with a confidence interval. */
            analysis?: {
                /** @constant */
                kind: "threshold";
                /**
                 * @description The parameter moved by the search, by path. Its own field in the spec is ignored (the search sets it at every step) and may not be an axis; for `load`, give neither `patterns` nor `load`.
                 * @enum {string}
                 */
                parameter: "load" | "inDegreeLoad" | "family.activity" | "family.parentOverlap" | "rule.threshold" | "rule.beta" | "dilution.keep" | "cue.fraction" | "dynamics.temperature";
                /**
                 * @description success: the fraction of trials whose final overlap reaches `successThreshold`; overlap: the mean final overlap. Default: success.
                 * @default success
                 * @enum {string}
                 */
                measure: "success" | "overlap";
                /**
                 * @description The level whose crossing is sought: a rate in (0, 1) for success, an overlap in (−1, 1) for overlap. Default: 0.5.
                 * @default 0.5
                 */
                level: number;
                /** @description Low end of the searched range. Required. */
                from: number;
                /** @description High end of the searched range (greater than `from`). Required. */
                to: number;
                /**
                 * @description How the measure moves as the parameter grows: decreasing (success falls with load, cue noise, temperature) or increasing. Default: decreasing.
                 * @default decreasing
                 * @enum {string}
                 */
                direction: "decreasing" | "increasing";
                /**
                 * @description Most parameter values evaluated per search, both ends included; each runs `trials` trials. Default: 12.
                 * @default 12
                 */
                maxSteps: number;
                /** @description Stop once the bracket around the crossing is at most this wide (units of the parameter). Default: (to − from)/32. */
                tolerance?: number;
                /**
                 * @description Confidence level of the step intervals that steer the search and of the reported interval. Default: 0.95.
                 * @default 0.95
                 */
                confidence: number;
                /**
                 * @description Finite-size scaling of the crossing over `neurons` (which must be an axis of at least 3 sizes, 4 with a fitted exponent): a weighted least-squares fit and its extrapolation to N → ∞. Default: null (no fit).
                 * @default null
                 */
                scaling: ({
                    /** @constant */
                    form: "power";
                    /**
                     * @description b in x_c(N) = x_∞ + a·N^(−b): a fixed positive number, or null to fit it (needs ≥ 4 sizes). Default: null.
                     * @default null
                     */
                    exponent: number | null;
                } | {
                    /** @constant */
                    form: "linear-inverse";
                }) | null;
            };
            /** @description Precision targets: instead of a fixed number of trials per point, blocks of trials until each point's 95 % interval is narrow enough, at most `trials`. Results say per point how many trials it took and whether it met the target. Absent: every point runs `trials` trials. */
            precision?: {
                /**
                 * @description The measure whose 95 % interval must be narrow enough: success (the recall success rate, Wilson interval) or overlap (the mean final overlap, mean ± 1.96·se).
                 * @enum {string}
                 */
                measure: "success" | "overlap";
                /** @description Target half-width of that 95 % interval: a point stops taking trial blocks once its interval is this narrow. */
                halfWidth: number;
                /** @description Trials per block: every point runs this many, then more blocks of the same size until it meets the target or reaches `trials` (the ceiling). */
                block: number;
            };
        };
        /**
         * @description queued: waiting for a worker; running: trials are being computed; succeeded: results are ready; failed: stopped by an error (see `error.kind`); canceled: stopped on request.
         * @enum {string}
         */
        SweepStatus: "queued" | "running" | "succeeded" | "failed" | "canceled";
        /**
         * @description queued: waiting for a worker; running: trials are being computed; succeeded: results are ready; failed: stopped by an error (see `error.kind`); canceled: stopped on request.
         * @enum {string}
         */
        SweepStatusInput: "queued" | "running" | "succeeded" | "failed" | "canceled";
        TheoryEvaluation: {
            specHash: string;
            /** @description One row per grid point in grid order; for an analysis, two per search (its range ends), search by search. */
            points: {
                /** @description Grid point index (the last axis varies fastest). For an analysis: the search, i.e. the point of the grid of the other varied parameters. */
                point: number;
                /**
                 * @description Analysis specs only: the end of the searched range this row is evaluated at (its realised value is in `values` under the searched parameter). Every step of the search lies between the two ends.
                 * @enum {string}
                 */
                end?: "from" | "to";
                /** @description The varied parameters at this point, by path: numbers; a rule axis gives the rule's label (its kind, then its parameters not at their defaults, e.g. `dense-polynomial(degree=3)`), a self-coupling axis true or false. */
                values: {
                    [key: string]: number | string | boolean;
                };
                params: {
                    neurons: number;
                    patterns: number;
                    /** @description The realised load P/N. */
                    alpha: number;
                };
                /** @description Theory values that hold at this point, by name (e.g. criticalLoad, retrievalOverlapRS, crosstalkErrorExact); {} when none does. */
                theory: {
                    [key: string]: number;
                };
                /** @description The other theory values of the point's model, by name, each with the reason it is missing here (it is then an empty cell in CSV). Every value, its domain and its source: docs/theory.md. */
                theoryUnavailable: {
                    [key: string]: components["schemas"]["TheoryUnavailableReason"];
                };
            }[];
        };
        /**
         * @description Why the value is missing: `model-outside-domain`: The theory assumes another model: learning-rule variant, self-coupling, neuron coding, pattern statistics or connectivity. `size-outside-domain`: The network is too small for the theory (for example fewer than two patterns where the value compares patterns). `load-outside-domain`: The load is outside the range where the theory holds (for example a vanishing-load result at a load that changes it). `temperature-outside-domain`: The temperature is outside the range where the theory holds (for example a T = 0 result at T > 0). `dynamics-outside-domain`: The update scheme is not the one the theory describes (for example a parallel-step result under asynchronous updates). `cue-outside-domain`: The cue is not the kind the theory starts from (for example a flip-cue result for a mixture cue). `no-retrieval-solution`: The theory holds here, and says there is no retrieval state (the load or temperature is past the retrieval boundary). `not-converged`: The numerical solution did not reach its accuracy target; the value is left out rather than reported inaccurate. `evaluation-failed`: Evaluating the value raised an error (a defect: please report the spec). The value is left out so that the sweep still completes.
         * @enum {string}
         */
        TheoryUnavailableReason: "model-outside-domain" | "size-outside-domain" | "load-outside-domain" | "temperature-outside-domain" | "dynamics-outside-domain" | "cue-outside-domain" | "no-retrieval-solution" | "not-converged" | "evaluation-failed";
        TrajectorySeries: {
            specHash: string;
            /** @constant */
            series: "trajectory";
            /** @description How a trial that stopped early is extended, in words. */
            padding: string;
            /** @description One entry per grid point, in grid order. */
            points: {
                point: number;
                /** @description The varied parameters at this point, by path: numbers; a rule axis gives the rule's label (its kind, then its parameters not at their defaults, e.g. `dense-polynomial(degree=3)`), a self-coupling axis true or false. */
                values: {
                    [key: string]: number | string | boolean;
                };
                params: {
                    /** @description Realised load per neuron P/N. */
                    alpha: number;
                    neurons: number;
                    patterns: number;
                    /** @description Under a fixed in-degree K only: the realised load per input P/K, the load that matters there. */
                    inDegreeLoad?: number;
                };
                /** @description The mean target overlap after each sweep (sweep 0: the cue); null when not recorded. */
                overlap: components["schemas"]["TrajectorySummary"] | null;
                /** @description The mean energy after each sweep, from sweep 1; null when not recorded. */
                energy: components["schemas"]["TrajectorySummary"] | null;
            }[];
        };
        /** @description Mean trajectory over the point's trials, index k = sweep firstSweep + k. A trial that stopped before the longest one holds its last value from then on. */
        TrajectorySummary: {
            /** @description The sweep of index 0 (0 for the overlap, whose sweep 0 is the cue; 1 for the energy). */
            firstSweep: number;
            mean: (number | null)[];
            sd: (number | null)[];
            se: (number | null)[];
            /** @description Trials still running at each sweep. */
            running: number[];
        };
        TrialRecord: {
            trial: number;
            target: number;
            initialOverlap: number | null;
            overlap: number | null;
            /** @description Largest |overlap| with another pattern (T > 0: time average over the measured sweeps). */
            maxOtherOverlap: number | null;
            sweeps: number;
            /** @enum {string} */
            ending: "fixed" | "cycle2" | "max" | "sampled";
            /** @description Energy of the final state (T > 0: time average over the measured sweeps). */
            energy: number | null;
            /**
             * @description End-state class of the final overlaps (T > 0: of the time-averaged overlaps).
             * @enum {string}
             */
            endState: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
            /** @description T > 0 only: fraction of the measured sweeps in each class. */
            endStateShares?: {
                target: number | null;
                reversed: number | null;
                otherPattern: number | null;
                symmetricMixture: number | null;
                partialTarget: number | null;
                spurious: number | null;
                spinGlass: number | null;
            };
            /**
             * @description T > 0 only: class of the state after the last sweep.
             * @enum {string}
             */
            finalEndState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
            /** @description T > 0 only: largest other overlap after the last sweep. */
            finalMaxOtherOverlap?: number | null;
            /** @description T > 0 only: energy after the last sweep. */
            finalEnergy?: number | null;
            /** @description Mixture cues only: overlap with each component, target first. */
            componentOverlaps?: (number | null)[];
            stability?: {
                unstableFraction: number | null;
                tieFraction: number | null;
                fixedPatternFraction: number | null;
            };
            /** @description First trial of each network, with measures.patternOverlaps: the overlaps between its stored patterns. */
            patternOverlaps?: {
                pairs: number;
                mean: number | null;
                meanAbs: number | null;
                rms: number | null;
                maxAbs: number | null;
            };
            overlapTrajectory?: (number | null)[];
            energyTrajectory?: (number | null)[];
        };
        WorkEstimate: {
            /** @description Grid points. */
            points: number;
            trialsPerPoint: number;
            /** @description points × trialsPerPoint. */
            trials: number;
            /** @description Expected neuron visits over the whole sweep. */
            neuronUpdates: number;
            /** @description Largest memory one worker holds at once: the costliest point's network with a chunk of trial records, or one point's trial records while its result is assembled. */
            peakBytes: number;
            /** @description Estimated CPU time of the whole sweep on one core of a reference machine (per-trial overhead included; measured error: see docs/limits.md). */
            cpuSeconds: number;
            /** @description Estimated storage of the sweep: every trial record as stored, plus the result rows. */
            storedBytes: number;
        };
    };
    responses: never;
    parameters: never;
    requestBodies: never;
    headers: never;
    pathItems: never;
};
export type $defs = Record<string, never>;
export interface operations {
    getLiveness: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The process is up. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["Liveness"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getReadiness: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description Ready to take requests. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["Readiness"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getMetrics: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description Metrics in the Prometheus text format 0.0.4. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "text/plain": string;
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getOpenApiDocument: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The OpenAPI document (the same as openapi/openapi.json in the repository). */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": {
                        [key: string]: unknown;
                    };
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    listSweeps: {
        parameters: {
            query?: {
                /** @description Only sweeps with this tag. */
                tag?: string;
                /** @description Only sweeps whose label or notes contain this text (case-insensitive). */
                q?: string;
                /** @description Only replicates of this sweep: the same spec but for its seed and label (re-runs with new seeds), itself included. */
                replicatesOf?: string;
                /** @description Whose sweeps: `*` for every owner's, or an owner's name. Default: your own. Only an admin token may name another owner or `*` (others get 403); on a server without tokens the single user is the admin. */
                owner?: string;
                status?: components["schemas"]["SweepStatusInput"];
                /** @description Page size, 1-100. Default: 20. */
                limit?: number;
                /** @description Opaque position from a previous page (nextCursor, or the Link rel="next" URL). */
                cursor?: string;
            };
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description One page of sweeps, newest first. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description `<…>; rel="next"` URL of the next page; absent on the last page. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepList"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    submitSweep: {
        parameters: {
            query?: {
                /** @description true: if you already have a succeeded sweep with the same spec hash, the new sweep reuses its results at once instead of running again. Default: false (a fresh run). */
                reuse?: "true" | "false";
                /** @description true (default): grid points whose trials your earlier sweeps already computed (same model parameters, seed and trial range: exactly the records a fresh run computes) are taken from them instead of computed; the status says how many (`reused`). false: compute everything. */
                reusePoints?: "true" | "false";
                /** @description An http(s) URL that gets a signed POST (a small JSON event: sweep id, status, links, finishedAt) each time the sweep ends: succeeded, failed or canceled. Retried with backoff; delivery shows in the status (`callback`). Private, loopback and link-local targets are refused (422) unless the operator allows them. See docs/callbacks.md for the signature. */
                callbackUrl?: string;
            };
            header?: {
                /** @description Makes a retried submission safe: the same key with the same spec returns the first sweep; with a different spec, 422. Kept 24 h. */
                "idempotency-key"?: string;
            };
            path?: never;
            cookie?: never;
        };
        requestBody: {
            content: {
                "application/json": components["schemas"]["SweepSpecInput"];
            };
        };
        responses: {
            /** @description The sweep has already finished (an Idempotency-Key repeated after it ended, or reused results): its final status. Location names it; no Retry-After. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Path of the sweep's status. */
                    Location?: string;
                    /** @description The same path: the body is that sweep's (final) status. */
                    "Content-Location"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Accepted, not finished yet: the sweep's status (Location names it; Retry-After suggests when to look again). */
            202: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Path of the new sweep's status. */
                    Location?: string;
                    /** @description Suggested seconds before the first status poll. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    validateSweep: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody: {
            content: {
                "application/json": components["schemas"]["SweepSpecInput"];
            };
        };
        responses: {
            /** @description The normalised spec, its hash and the work estimate. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SpecValidation"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweep: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The sweep's status, progress and normalised spec. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Weak validator of the sweep's state; send it in If-None-Match to get 304 until the sweep changes. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Not modified since the ETag given in If-None-Match. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    cancelSweep: {
        parameters: {
            query?: {
                /** @description true, on a finished sweep: remove the sweep, its stored chunks and its results for good (its owner only; irreversible). Without it, DELETE cancels an active sweep. */
                purge?: "true" | "false";
            };
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description Cancel requested: the sweep's record after the change. */
            202: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Purged: the sweep and everything stored for it are gone. */
            204: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    annotateSweep: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody: {
            content: {
                "application/json": components["schemas"]["SweepAnnotationInput"];
            };
        };
        responses: {
            /** @description The sweep after the change. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    extendSweep: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody: {
            content: {
                "application/json": components["schemas"]["SweepExtensionInput"];
            };
        };
        responses: {
            /** @description The extension, already finished (everything was taken from earlier sweeps). */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Path of the sweep's status. */
                    Location?: string;
                    /** @description The same path: the body is that sweep's (final) status. */
                    "Content-Location"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description The extension, queued. */
            202: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Path of the new sweep's status. */
                    Location?: string;
                    /** @description Suggested seconds before the first status poll. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    resumeSweep: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description Resumed: the sweep is queued again. */
            202: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Path of the sweep's status. */
                    Location?: string;
                    /** @description Suggested seconds before the next status poll. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepDetail"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_FORBIDDEN, MEMSWEEP_OWNER_ONLY. */
            403: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweepResults: {
        parameters: {
            query?: {
                /** @description Overrides the Accept header. arrow: an Apache Arrow IPC file (application/vnd.apache.arrow.file) with the CSV's columns, typed (int64 counts, float64 measures, utf8 names, bool flags; empty cells are nulls). */
                format?: "json" | "csv" | "arrow";
                /** @description true: one record per trial (JSON: a `trials` member; CSV and Arrow: one row per trial). Default: false (one row per grid point). */
                trials?: "true" | "false";
                /** @description JSON only. true: include the run timing (wallSeconds, cpuSeconds, workers) in the provenance. Default false, so the bytes depend on the spec and the code only. */
                timing?: "true" | "false";
                /** @description true: for a sweep that has not succeeded (running, canceled, failed), the rows of the points finished so far, marked as partial (JSON: a `partial` member; CSV: the header `Memsweep-Partial: <points done>/<points>` and a file name ending in -partial). A succeeded sweep answers its full result. Not with trials=true. */
                partial?: "true" | "false";
                /** @description Another series instead of the rows. trajectory: the mean overlap (and energy) trajectory of every grid point with its spread, as long-format CSV (one row per point and sweep: point, the varied parameters, neurons, patterns, alpha, sweep, running, overlap.mean|sd|se, energy.mean|sd|se) or JSON ({ specHash, series, padding, points: [{ point, values, params, overlap, energy }] }); needs measures.overlapTrajectory or energyTrajectory in the spec (else 400 naming `series`); not with trials=true. A trial that stopped (fixed point or 2-cycle) before the longest trial of its point holds its last value from then on; `running` counts the trials still running at each sweep. Sweep 0 of the overlap is the cue. */
                series?: "trajectory";
            };
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The results. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per representation. */
                    ETag?: string;
                    /** @description Accept. */
                    Vary?: string;
                    /** @description CSV only: attachment; filename="memsweep-<id>.csv". */
                    "Content-Disposition"?: string;
                    /** @description Partial results only (?partial=true on a sweep that has not succeeded): `<points done>/<points>`; such answers carry Cache-Control: no-store and no ETag. */
                    "Memsweep-Partial"?: string;
                    /** @description A finished result never changes: private, immutable. Partial results: no-store. */
                    "Cache-Control"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["SweepResult"] | components["schemas"]["TrajectorySeries"];
                    "text/csv": string;
                    "application/vnd.apache.arrow.file": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    /** @description Accept. */
                    Vary?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_ACCEPTABLE. */
            406: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While the sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While the sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    streamSweepEvents: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /**
             * @description A text/event-stream. Events, each with an increasing `id:`:
             *     - `snapshot` (first): the SweepStatus as GET /v1/sweeps/{id} returns it (without the spec);
             *     - `progress`: the SweepStatus after more trials finished (at most about 4 per second);
             *     - `state`: the SweepStatus after a change of status; after a terminal one (succeeded, failed, canceled) the server closes the stream.
             *     Every stream ends with that terminal `state` event: for a sweep that had already ended, the stream is its `snapshot`, then its `state`, then the close.
             *     Lines starting with `:` are heartbeats (`: ping`). A reconnecting client gets a fresh snapshot.
             */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "text/event-stream": string;
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    evaluateTheory: {
        parameters: {
            query?: never;
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody: {
            content: {
                "application/json": components["schemas"]["SweepSpecInput"];
            };
        };
        responses: {
            /** @description Theory values at every grid point. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/json": components["schemas"]["TheoryEvaluation"];
                };
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_BODY_TOO_LARGE. */
            413: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNSUPPORTED_MEDIA_TYPE. */
            415: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweepFigure: {
        parameters: {
            query?: {
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
                /** @description true: for a sweep that has not succeeded, the figure of the points finished so far (drawn afresh each time, never cached). A succeeded sweep answers its full figure. */
                partial?: "true" | "false";
            };
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "image/svg+xml": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getOverlayFigure: {
        parameters: {
            query: {
                /** @description Ids of the succeeded sweeps to overlay, separated by commas (at most 8); series are labelled by each sweep's label. */
                sweeps: string;
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
            };
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "image/svg+xml": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweepFigurePng: {
        parameters: {
            query?: {
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
                /** @description Resolution of the PNG in dots per inch (72–1200). Default: 300 for a size in mm; 192 for a size in px (2 pixels per px). */
                dpi?: number;
                /** @description true: for a sweep that has not succeeded, the figure of the points finished so far (drawn afresh each time, never cached). A succeeded sweep answers its full figure. */
                partial?: "true" | "false";
            };
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "image/png": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getOverlayFigurePng: {
        parameters: {
            query: {
                /** @description Ids of the succeeded sweeps to overlay, separated by commas (at most 8); series are labelled by each sweep's label. */
                sweeps: string;
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
                /** @description Resolution of the PNG in dots per inch (72–1200). Default: 300 for a size in mm; 192 for a size in px (2 pixels per px). */
                dpi?: number;
            };
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "image/png": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweepFigurePdf: {
        parameters: {
            query?: {
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
                /** @description true: for a sweep that has not succeeded, the figure of the points finished so far (drawn afresh each time, never cached). A succeeded sweep answers its full figure. */
                partial?: "true" | "false";
            };
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/pdf": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getOverlayFigurePdf: {
        parameters: {
            query: {
                /** @description Ids of the succeeded sweeps to overlay, separated by commas (at most 8); series are labelled by each sweep's label. */
                sweeps: string;
                /** @description What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success. */
                measure?: "success" | "overlap" | "sweeps" | "maxOtherOverlap" | "energy" | "endState" | "unstableFraction" | "fixedPatternFraction" | "patternOverlapMeanAbs" | "patternOverlapMaxAbs";
                /** @description With measure=endState: the class of final state counted. Default: target. */
                endState?: "target" | "reversed" | "otherPattern" | "symmetricMixture" | "partialTarget" | "spurious" | "spinGlass";
                /** @description Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie). */
                x?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x. */
                series?: "neurons" | "patterns" | "load" | "inDegreeLoad" | "family.activity" | "family.parents" | "family.parentOverlap" | "rule" | "rule.selfCoupling" | "rule.threshold" | "rule.degree" | "rule.beta" | "dilution.keep" | "dilution.inDegree" | "cue.fraction" | "cue.components" | "dynamics.temperature" | "dynamics.maxSweeps" | "dynamics.burnIn" | "successThreshold" | "trialsPerNetwork";
                /** @description x axis scale; log needs positive x values. Default: linear. */
                xScale?: "linear" | "log";
                /** @description y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear. */
                yScale?: "linear" | "log";
                /** @description ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci. */
                errorBars?: "ci" | "se" | "sd" | "none";
                /** @description Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit. */
                analysis?: "crossings" | "scaling";
                /** @description Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true. */
                theory?: boolean;
                /** @description Width in px (screen figures). Default: 640, unless the size is given in mm. */
                width?: number;
                /** @description Height in px (screen figures). Default: 440. */
                height?: number;
                /** @description Print size of a journal column: single (85 × 64 mm) or double (180 × 112 mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt. */
                column?: "single" | "double";
                /** @description Width in mm (print figures; not with width or height in px). */
                widthMm?: number;
                /** @description Height in mm (print figures). Default: three quarters of the width, or the column's height. */
                heightMm?: number;
                /** @description Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: 12 px, 7.5 pt. */
                fontSize?: number;
                /** @description Title. Default: the sweep label, or the measure against x. */
                title?: string;
                /** @description Draw the title. Default: true. */
                showTitle?: boolean;
                /** @description Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials). */
                subtitle?: string;
                /** @description Draw the subtitle. Default: true. */
                showSubtitle?: boolean;
                /** @description Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine. */
                footnote?: string;
                /** @description Draw the footnote. Default: true. */
                showFootnote?: boolean;
                /** @description Names of the series in the order drawn, separated by | (an empty name keeps the generated one). */
                seriesNames?: string;
                /** @description Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened. */
                sweepNames?: string;
            };
            header?: never;
            path?: never;
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The figure. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url), one per set of options. */
                    ETag?: string;
                    /** @description inline; filename="memsweep-<id>-<measure>.<svg, png or pdf>" (overlays: memsweep-overlay-<measure>.<format>). */
                    "Content-Disposition"?: string;
                    /** @description default-src 'none': the figure runs and loads nothing. */
                    "Content-Security-Policy"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/pdf": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_MALFORMED_REQUEST. */
            400: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_SPEC_INVALID, MEMSWEEP_WORK_LIMIT_EXCEEDED, MEMSWEEP_IDEMPOTENCY_KEY_REUSED, MEMSWEEP_CALLBACK_REFUSED, MEMSWEEP_FIGURE_OPTIONS_UNFIT. */
            422: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
    getSweepBundle: {
        parameters: {
            query?: never;
            header?: never;
            path: {
                /** @description Sweep id, as returned by POST /v1/sweeps (1-64 letters, digits, - and _; anything else is a 400). */
                id: string;
            };
            cookie?: never;
        };
        requestBody?: never;
        responses: {
            /** @description The bundle. */
            200: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Strong validator: the sha256 of the bytes (base64url); it changes when the sweep's label, tags or notes (in the README and provenance) do. */
                    ETag?: string;
                    /** @description attachment; filename="memsweep-<id>.zip". */
                    "Content-Disposition"?: string;
                    /** @description private, no-cache: revalidate with If-None-Match (an annotation edit changes the bundle). */
                    "Cache-Control"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/zip": string;
                };
            };
            /** @description Not modified: the ETag in If-None-Match is current. */
            304: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description The current validator. */
                    ETag?: string;
                    [name: string]: unknown;
                };
                content?: never;
            };
            /** @description Problem details: MEMSWEEP_UNAUTHENTICATED. */
            401: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Bearer challenge. */
                    "WWW-Authenticate"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_ROUTE_NOT_FOUND, MEMSWEEP_SWEEP_NOT_FOUND. */
            404: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RESULTS_NOT_READY, MEMSWEEP_RESULTS_UNAVAILABLE, MEMSWEEP_SWEEP_FINISHED, MEMSWEEP_SWEEP_ACTIVE, MEMSWEEP_NOT_RESUMABLE. */
            409: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description While a sweep runs: suggested seconds before asking again. */
                    "Retry-After"?: number;
                    /** @description While a sweep runs: `<…>; rel="monitor"`, the status to follow. */
                    Link?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_RATE_LIMITED, MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS, MEMSWEEP_TOO_MANY_AUTH_FAILURES. */
            429: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds until the limit resets (or until a sweep may have finished). */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_INTERNAL. */
            500: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
            /** @description Problem details: MEMSWEEP_NOT_READY. */
            503: {
                headers: {
                    /** @description The request id (the client's, when it sent a plain one); also in problem documents and in the server log. */
                    "X-Request-Id"?: string;
                    /** @description Seconds before trying again. */
                    "Retry-After"?: number;
                    [name: string]: unknown;
                };
                content: {
                    "application/problem+json": components["schemas"]["Problem"];
                };
            };
        };
    };
}
