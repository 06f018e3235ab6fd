"""The complete result of one stability evaluation: what every view consumes.

:func:`deckload.core.stability.evaluate` is the only producer.  The screens, the
voyage log and the report read these frozen objects and never recompute.
Units and signs as in :mod:`deckload.core.model`.
"""

from __future__ import annotations

from dataclasses import dataclass

TANK_STATES = ("empty", "slack", "worst_band", "full")
"""Tank states: empty; slack; slack inside its worst free-surface band; nominally full (≥ 98 %)."""


@dataclass(frozen=True)
class TankResult:
    id: str
    name: str
    kind: str
    fill_pct: float
    """Volume as a percentage of capacity."""
    volume_m3: float
    mass_t: float
    density_t_m3: float
    sounding_m: float
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


@dataclass(frozen=True)
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


@dataclass(frozen=True)
class CriterionResult:
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

    @property
    def margin(self) -> float:
        """Distance to the limit in the passing direction (negative when failed)."""
        return self.value - self.limit if self.comparison == ">=" else self.limit - self.value

    @property
    def margin_fraction(self) -> float:
        """Margin as a fraction of the limit (for the 'within 10 %' warning)."""
        return self.margin / abs(self.limit) if self.limit else float("inf")


@dataclass(frozen=True)
class Warning:
    code: str
    """Short machine-readable code, e.g. 'slack-worst-band', 'criterion-failed'."""
    message: str
    """The warning in words, naming the tank, criterion or limit."""
    severity: str = "caution"
    """'caution' or 'danger'."""


@dataclass(frozen=True)
class Result:
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
    list_deg: float

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

    @property
    def all_criteria_pass(self) -> bool:
        return all(c.passed for c in self.criteria)

    @property
    def smallest_margin(self) -> CriterionResult | None:
        """The criterion closest to (or furthest past) its limit, relative to the limit."""
        return min(self.criteria, key=lambda c: c.margin_fraction, default=None)

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
            "area_0_40_mrad": self.area_0_40_mrad,
            "area_30_40_mrad": self.area_30_40_mrad,
            "gz": [{"heel_deg": h, "gz_m": g} for h, g in zip(self.gz_heel_deg, self.gz_m)],
            "gz_port": [{"heel_deg": h, "gz_m": g} for h, g in zip(self.gz_heel_deg, self.gz_port_m)],
            "criteria": [
                {
                    "id": c.id,
                    "description": c.description,
                    "value": c.value,
                    "limit": c.limit,
                    "unit": c.unit,
                    "comparison": c.comparison,
                    "margin": c.margin,
                    "pass": c.passed,
                    "source": c.source,
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
        }
