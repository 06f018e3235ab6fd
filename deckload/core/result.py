"""The complete result of one stability evaluation: what every view consumes.

:func:`deckload.core.stability.evaluate` is the only producer.  The screens, the
voyage log and the report read these frozen objects and never recompute.
Units and signs as in :mod:`deckload.core.model`.
"""

from __future__ import annotations

from deckload.core.bounds import ROUND_OFF, below_limit, over_limit
from deckload.core.frozen import frozen

TANK_STATES = ("empty", "slack", "worst_band", "full")
"""Tank states: empty; slack; slack inside its worst free-surface band; nominally full (≥ 98 %)."""


@frozen
class TankResult:
    """One tank in an evaluated condition: contents, centres and free-surface moment."""

    id: str
    name: str
    kind: str
    fill_pct: float
    """Volume as a percentage of capacity."""
    volume_m3: float
    mass_t: float
    density_t_m3: float
    sounding_m: float | None
    """Level above the tank's lowest point (m); None for a tank known only by capacity and centre."""
    lcg_m: float
    vcg_m: float
    tcg_m: float
    fsi_m4: float
    """Free-surface inertia at the actual level (m⁴)."""
    fsm_tm: float
    """Free-surface moment counted in this condition (t·m), after the rule below."""
    fs_rule: str
    """Why ``fsm_tm`` has its value, e.g. 'actual level', 'max (variable level)'."""
    state: str
    """One of :data:`TANK_STATES`."""
    worst_band_pct: tuple[float, float]
    """The tank's worst slack band (% fill)."""
    capacity_m3: float


@frozen
class ItemResult:
    """A hold, deck or constant item as it enters the weight sum."""

    group: str
    """'lightship', 'hold', 'deck' or 'constant'."""
    id: str
    name: str
    mass_t: float
    lcg_m: float
    vcg_m: float
    tcg_m: float


def meets(value: float, limit: float, comparison: str) -> bool:
    """``value`` against ``limit`` by ``comparison`` ('>=' or '<='), the limit itself included
    (IS 2008 words its limits "not less than" / "not more than"), within the round-off allowance
    every stated amount has (:data:`deckload.core.bounds.ROUND_OFF`): a GM worked out as
    0.34999999999999964 m from 0.35 m of typed data meets 0.35 m."""
    return not below_limit(value, limit) if comparison == ">=" else not over_limit(value, limit)


@frozen
class CriterionResult:
    """One criterion assessed: the value, the limit, pass or fail, and its source."""

    id: str
    """Stable identifier, e.g. 'IS2008-A2.2.1-area-0-30'."""
    description: str
    """What is measured, in words."""
    value: float
    """The vessel's value in ``unit``."""
    limit: float
    """The limit in ``unit``."""
    unit: str
    """'m', 'm·rad' or 'deg'."""
    comparison: str
    """'>=' or '<=': how value must stand against limit."""
    passed: bool
    source: str
    """Where the limit comes from (standard and paragraph, or the profile)."""
    note: str = ""
    set_id: str = ""
    """The criteria set this criterion belongs to (an :class:`AssessedSet` id), e.g. 'IS2008-A2.2'."""
    assessed: bool = True
    """False when the data cannot decide it (e.g. KN end before the angle it needs): then
    ``passed`` is False, ``value`` is not a measurement, and ``note`` says why."""

    @property
    def margin(self) -> float:
        """Distance to the limit in the passing direction (negative when failed).

        Not meaningful when ``assessed`` is False; nil within the round-off allowance of the limit, as
        :func:`meets` takes it (a "−0.00000" beside a pass would contradict it).  A criterion failed on
        more than its value and limit (the weather criterion rolled to windward past the gust's
        intercept, :func:`deckload.core.verdict.weather_criterion`) has its distance counted against it."""
        m = self.value - self.limit if self.comparison == ">=" else self.limit - self.value
        if abs(m) <= ROUND_OFF * max(1.0, abs(self.limit)):
            return 0.0
        return -abs(m) if self.assessed and not self.passed else m

    @property
    def margin_fraction(self) -> float:
        """Margin as a fraction of the limit (for the 'within 10 %' warning)."""
        return self.margin / abs(self.limit) if self.limit else float("inf")


@frozen
class AssessedSet:
    """A criteria set that was assessed for this condition, e.g. IS 2008 Part A 2.2."""

    id: str
    """Stable identifier, e.g. 'IS2008-A2.2', 'IS2008-A2.3', 'profile-extra'."""
    title: str
    """In words, e.g. 'IS Code 2008 Part A 2.2 general criteria'."""
    passed: bool
    """Every criterion of the set assessed and met."""


@frozen
class NotAssessed:
    """Something a master might expect in the verdict that was not assessed, and why."""

    item: str
    """e.g. 'IS Code 2008 Part A 2.3 weather criterion', 'damage stability'."""
    reason: str
    """e.g. 'the profile has no windage data', 'not computed by deckload'."""
    applies: bool = False
    """A criteria set that applies to her (her type's, or her profile's limiting curve) and could
    not be assessed for want of data: the verdict cannot then read "Met".  False for what deckload
    never computes and for notes of scope."""


@frozen
class WeatherResult:
    """IS Code 2008 Part A 2.3, severe wind and rolling: the numbers behind the criterion."""

    wind_pressure_pa: float
    windage_area_m2: float
    """A: projected lateral area above the waterline (m²)."""
    windage_lever_m: float
    """Z: from the centre of A to the centre of the underwater lateral area, or about half the draft."""
    lw1_m: float
    """Steady wind heeling lever P·A·Z/(1000·g·Δ)."""
    lw2_m: float
    """Gust heeling lever 1.5·lw1."""
    theta0_deg: float
    """Angle of heel under the steady wind (first intercept of lw1 with GZ)."""
    theta0_limit_deg: float
    """min(16°, 0.8 × deck-edge immersion angle)."""
    theta1_deg: float
    """Angle of roll to windward, 109·k·X1·X2·√(r·s)."""
    theta2_deg: float
    """Upper end of area b: min(θf, 50°, θc)."""
    theta_c_deg: float | None
    """Second intercept of lw2 with GZ, None when GZ stays above lw2 to the end of the curve."""
    area_a_mrad: float
    area_b_mrad: float
    roll_period_s: float
    k: float
    x1: float
    x2: float
    r: float
    s: float
    deck_edge_angle_deg: float | None = None
    theta_r_deg: float | None = None
    """First intercept of lw2 with GZ: where area a ends and area b begins (None: GZ never reaches lw2)."""
    windage_centroid_above_wl_m: float | None = None
    """Height of the centre of A above the waterline (m)."""
    waterline_length_m: float | None = None
    """Lwl used for C, Cb and Ak·100/(L·B) (m)."""


@frozen
class Warning:
    """A warning raised by the evaluation, with a code for machines and words for the officer."""

    code: str
    """Short machine-readable code, e.g. 'slack-worst-band', 'criterion-failed'."""
    message: str
    """The warning in words, naming the tank, criterion or limit."""
    severity: str = "caution"
    """'caution' or 'danger'."""


@frozen
class Result:
    """Everything computed for one condition: weights, free surface, floating position, GZ curve,
    criteria and warnings.  Views, the log and the report read it and never recompute."""

    vessel_name: str
    condition_name: str
    water_density_t_m3: float

    displacement_t: float
    lightship_t: float
    deadweight_t: float
    lcg_m: float
    kg_m: float
    """Solid KG (m): Σw·z / Δ."""
    tcg_m: float
    fsm_total_tm: float
    fsc_m: float
    """Free-surface correction ΣFSM/Δ (m): the virtual rise of G."""
    kg_fluid_m: float

    draft_at_lcf_m: float
    lcb_m: float
    lcf_m: float
    km_m: float
    tpc_t_cm: float
    mctc_tm_cm: float
    gm_solid_m: float
    gm_fluid_m: float
    trim_m: float
    draft_aft_m: float
    draft_fwd_m: float
    draft_mean_m: float
    """Draft at midships (m)."""
    list_deg: float | None
    """Heel of equilibrium (degrees, + starboard); None when GZ never becomes positive on the side
    she heels to: no position of equilibrium up to the curve's last angle (a danger warning says so)."""

    gz_heel_deg: tuple[float, ...]
    """Heel angles of the GZ curve (degrees, 0–90, heeling to starboard)."""
    gz_m: tuple[float, ...]
    """GZ (m) at each angle, heeling to starboard: KN − KG_fluid·sinφ − TCG·cosφ."""
    gz_port_m: tuple[float, ...]
    """GZ (m) heeling to port at the same angles: KN − KG_fluid·sinφ + TCG·cosφ."""
    criteria_side: str
    """'starboard' or 'port': the side the criteria were checked on (the side she lists to)."""
    gz_correction: str
    """'constant' or 'transfer': how free surface entered the GZ curve."""
    fs_rule: str
    """'is2008' or 'actual'."""
    max_gz_m: float
    max_gz_angle_deg: float
    vanishing_angle_deg: float | None
    downflooding_angle_deg: float | None
    area_0_30_mrad: float
    area_0_40_mrad: float
    area_30_40_mrad: float

    criteria: tuple[CriterionResult, ...]
    tanks: tuple[TankResult, ...]
    items: tuple[ItemResult, ...]
    warnings: tuple[Warning, ...]

    criteria_sets: tuple[AssessedSet, ...] = ()
    """The criteria sets assessed, in the order shown."""
    not_assessed: tuple[NotAssessed, ...] = ()
    """What was not assessed, and why: always lists at least what deckload never computes."""
    weather: WeatherResult | None = None
    deck_edge_angle_deg: float | None = None
    """Angle of heel at which the deck edge at midships immerses (upright trim), if known."""
    freeboard_m: float | None = None
    """Freeboard at midships, from the deck line to the midships draft (m)."""
    load_line_margin_m: float | None = None
    """Permitted midships draft at the mark in use (FWA/DWA applied) minus the actual draft;
    negative when she is over her mark."""
    gz_end_deg: float = 90.0
    """Last heel angle the KN tables reach; the curve, areas and plots stop here."""
    load_line_mark: str | None = None
    """Name of the load-line mark in use (the condition's, else summer); None without marks."""
    load_line_mark_draft_m: float | None = None
    """That mark's own midships draft, in the water it is set for (m)."""
    load_line_allowed_draft_m: float | None = None
    """Midships draft allowed at that mark in the water she floats in (m): the mark's draft plus
    the dock-water allowance (:attr:`dock_water_allowance_m`)."""
    downflooding_given: bool = False
    """The profile gives downflooding angles; with :attr:`downflooding_angle_deg` None they do not reach
    this displacement (θf unknown: the criteria worked to θf are not assessable).  Without them θf is
    taken as none (a caution says so)."""

    @property
    def downflooding_unknown(self) -> bool:
        """The profile gives downflooding angles but they do not reach this displacement: θf is
        unknown, so the areas to 40° or θf are not known either."""
        return self.downflooding_given and self.downflooding_angle_deg is None

    def area_to_flooding_mrad(self, name: str) -> float | None:
        """``area_0_40_mrad`` or ``area_30_40_mrad``, or None when θf is unknown: the stored
        value is then the area with no openings, which may overstate the area to θf
        (IS 2008 Part A 2.2.1 stops both areas at θf when it is less than 40°)."""
        return None if self.downflooding_unknown else getattr(self, name)

    @property
    def dock_water_allowance_m(self) -> float | None:
        """How much deeper than its own draft the mark allows in this water (m): the DWA,
        FWA·(ρ_mark − ρ)/0.025 (deckload.core.hydrostatics.permitted_draft_m)."""
        if self.load_line_allowed_draft_m is None or self.load_line_mark_draft_m is None:
            return None
        return self.load_line_allowed_draft_m - self.load_line_mark_draft_m

    @property
    def sets_not_assessed(self) -> tuple[NotAssessed, ...]:
        """The criteria sets that apply to her and could not be assessed (:attr:`NotAssessed.applies`)."""
        return tuple(n for n in self.not_assessed if n.applies)

    @property
    def all_criteria_pass(self) -> bool:
        """Every criterion passes, none was left unassessed, and no set that applies to her was left out.

        Never show this alone: :meth:`verdict_text` names the sets and what was not assessed."""
        return all(c.passed and c.assessed for c in self.criteria) and not self.sets_not_assessed

    def verdict_text(self) -> str:
        """One honest sentence-set for every summary: the sets assessed, the result, and what
        was not assessed.  Views print this, never a bare 'all criteria met'."""
        names = ", ".join(s.title for s in self.criteria_sets) or "no criteria set"
        failed = [c for c in self.criteria if c.assessed and not c.passed]
        open_ = [c for c in self.criteria if not c.assessed]
        missing = self.sets_not_assessed
        if failed:
            head = f"NOT MET ({len(failed)} failed) — assessed: {names}."
        elif open_ or missing:
            parts = []
            if open_:
                parts.append(f"{len(open_)} {'criterion' if len(open_) == 1 else 'criteria'} not assessable")
            if missing:
                parts.append(f"{len(missing)} {'set' if len(missing) == 1 else 'sets'} of criteria not assessed")
            head = f"Met where assessable, {', '.join(parts)} — assessed: {names}."
        else:
            head = f"Met: {names}."
        if self.not_assessed:
            # Items that share a reason are named together, the reason once (order kept).
            by_reason: dict[str, list[str]] = {}
            for n in self.not_assessed:
                by_reason.setdefault(n.reason, []).append(n.item)
            head += " Not assessed: " + "; ".join(f"{', '.join(items)} ({why})" for why, items in by_reason.items()) + "."
        return head

    @property
    def smallest_margin(self) -> CriterionResult | None:
        """The assessed criterion closest to (or furthest past) its limit, relative to the limit.

        A criterion that could not be assessed has no margin, so it is never the smallest."""
        return min((c for c in self.criteria if c.assessed), key=lambda c: c.margin_fraction, default=None)

    def to_json_dict(self) -> dict:
        """The result as plain JSON types, with the keys documented in the README."""
        return {
            "vessel": self.vessel_name,
            "condition": self.condition_name,
            "water_density_t_m3": self.water_density_t_m3,
            "displacement_t": self.displacement_t,
            "lightship_t": self.lightship_t,
            "deadweight_t": self.deadweight_t,
            "lcg_m": self.lcg_m,
            "kg_m": self.kg_m,
            "tcg_m": self.tcg_m,
            "fsm_total_tm": self.fsm_total_tm,
            "fsc_m": self.fsc_m,
            "kg_fluid_m": self.kg_fluid_m,
            "km_m": self.km_m,
            "gm_solid_m": self.gm_solid_m,
            "gm_fluid_m": self.gm_fluid_m,
            "lcb_m": self.lcb_m,
            "lcf_m": self.lcf_m,
            "tpc_t_cm": self.tpc_t_cm,
            "mctc_tm_cm": self.mctc_tm_cm,
            "draft_at_lcf_m": self.draft_at_lcf_m,
            "draft_aft_m": self.draft_aft_m,
            "draft_fwd_m": self.draft_fwd_m,
            "draft_mean_m": self.draft_mean_m,
            "trim_m": self.trim_m,
            "list_deg": self.list_deg,
            "gz_correction": self.gz_correction,
            "fs_rule": self.fs_rule,
            "criteria_side": self.criteria_side,
            "max_gz_m": self.max_gz_m,
            "max_gz_angle_deg": self.max_gz_angle_deg,
            "vanishing_angle_deg": self.vanishing_angle_deg,
            "downflooding_angle_deg": self.downflooding_angle_deg,
            "area_0_30_mrad": self.area_0_30_mrad,
            "area_0_40_mrad": self.area_to_flooding_mrad("area_0_40_mrad"),
            "area_30_40_mrad": self.area_to_flooding_mrad("area_30_40_mrad"),
            "gz": [{"heel_deg": h, "gz_m": g} for h, g in zip(self.gz_heel_deg, self.gz_m)],
            "gz_port": [{"heel_deg": h, "gz_m": g} for h, g in zip(self.gz_heel_deg, self.gz_port_m)],
            "criteria": [
                {
                    "id": c.id,
                    "description": c.description,
                    "value": c.value if c.assessed else None,
                    "limit": c.limit,
                    "unit": c.unit,
                    "comparison": c.comparison,
                    "margin": c.margin if c.assessed else None,
                    "pass": c.passed,
                    "assessed": c.assessed,
                    "set": c.set_id,
                    "source": c.source,
                    "note": c.note,
                }
                for c in self.criteria
            ],
            "tanks": [
                {
                    "id": t.id,
                    "name": t.name,
                    "kind": t.kind,
                    "fill_pct": t.fill_pct,
                    "volume_m3": t.volume_m3,
                    "mass_t": t.mass_t,
                    "density_t_m3": t.density_t_m3,
                    "sounding_m": t.sounding_m,
                    "fsm_tm": t.fsm_tm,
                    "fs_rule": t.fs_rule,
                    "state": t.state,
                }
                for t in self.tanks
            ],
            "items": [
                {"group": i.group, "id": i.id, "name": i.name, "mass_t": i.mass_t,
                 "lcg_m": i.lcg_m, "vcg_m": i.vcg_m, "tcg_m": i.tcg_m}
                for i in self.items
            ],
            "warnings": [w.message for w in self.warnings],
            "assessed": [{"id": a.id, "title": a.title, "pass": a.passed} for a in self.criteria_sets],
            "not_assessed": [{"item": n.item, "reason": n.reason, "applies": n.applies} for n in self.not_assessed],
            "verdict": self.verdict_text(),
            "weather": None if self.weather is None else dict(vars(self.weather)),
            "deck_edge_angle_deg": self.deck_edge_angle_deg,
            "freeboard_m": self.freeboard_m,
            "load_line_margin_m": self.load_line_margin_m,
            "load_line_mark": self.load_line_mark,
            "load_line_mark_draft_m": self.load_line_mark_draft_m,
            "load_line_allowed_draft_m": self.load_line_allowed_draft_m,
            "gz_end_deg": self.gz_end_deg,
        }
