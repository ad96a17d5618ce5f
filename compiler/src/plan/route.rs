//! Up to four roots of a quartic routed to four labelled slots, with no branch on data: each
//! slot takes a root with its label (a real root before a complex pair's real part), and a
//! slot whose label no root has takes a real root no slot took (two real roots can share a
//! label; the second would otherwise be lost: it keeps its values under this slot's label),
//! else fails its check. Families whose position step is a quartic (the general, mid-wrist and
//! three-parallel families) label their roots by two signs and route them here.

use crate::plan::graph::{Graph, Id};

/// Added to a root's residual in the slots of the labels it does not have: such a candidate
/// always fails its check (m²). A number of the routing, not a tolerance: the same in `f32`
/// (where a tolerance's scaling would take it past the largest `f32`).
pub const MISMATCH: f64 = 1e30;

/// One root to route.
#[derive(Clone, Debug)]
pub struct Root {
    /// Every value a slot carries for it (joint values, turns, check limits...).
    pub values: Vec<Id>,
    /// Its squared miss (m²): within the squared length tolerance for a real root.
    pub residual: Id,
    /// Its two label signs: `≥ 0` for the first word of each pair.
    pub labels: [Id; 2],
    /// Among roots with one label, the smaller rank goes first (a rank that rounding cannot
    /// swap, so that solving again at the same pose routes alike).
    pub rank: Id,
}

/// One labelled slot.
#[derive(Clone, Debug)]
pub struct Slot {
    /// The values of the root it took.
    pub values: Vec<Id>,
    /// Its residual, or at least [`MISMATCH`] when it took no root.
    pub score: Id,
    /// The slot's label: `true` for the first word of each pair.
    pub labels: [bool; 2],
}

/// The note of a slot's score when it is a plain residual (or a spare root's).
pub const SPARE_NOTE: &str =
    "the residual of this label's root (or of a spare root, when none has the label)";

impl Slot {
    /// The slot's tag for the names of its values: one letter per label, the first of each
    /// pair in `letters` when the label is `true` (`[["f", "a"], ["u", "d"]]` gives `fu`, `fd`,
    /// `au`, `ad`).
    pub fn tag(&self, letters: [[&str; 2]; 2]) -> String {
        let pick = |i: usize| letters[i][usize::from(!self.labels[i])];
        format!("{}{}", pick(0), pick(1))
    }

    /// The slot's score, named `miss_{tag}` with `note` (what it is the residual of).
    pub fn named_score(&self, g: &mut Graph, tag: &str, note: &str) -> Id {
        g.name(self.score, &format!("miss_{tag}"), note)
    }
}

/// The four slots' labels, in order.
pub const SLOTS: [[bool; 2]; 4] = [[true, true], [true, false], [false, true], [false, false]];

/// The values of one root a slot carries, with indicators (1 or 0) of which root it is.
#[derive(Clone)]
struct Bundle {
    values: Vec<Id>,
    residual: Id,
    which: [Id; 4],
}

impl Bundle {
    fn pick(g: &mut Graph, c: Id, a: &Bundle, b: &Bundle) -> Bundle {
        let values = a
            .values
            .iter()
            .zip(&b.values)
            .map(|(&x, &y)| g.select(c, x, y))
            .collect();
        let residual = g.select(c, a.residual, b.residual);
        let which = [0, 1, 2, 3].map(|i| g.select(c, a.which[i], b.which[i]));
        Bundle {
            values,
            residual,
            which,
        }
    }
}

/// The bundle with the smallest rank, and its check value (`checks[i]` for bundle `i`).
fn smallest(g: &mut Graph, bundles: &[Bundle], ranks: &[Id], checks: &[Id]) -> (Bundle, Id) {
    let mut best = bundles[0].clone();
    let mut rank = ranks[0];
    let mut check = checks[0];
    for ((b, &r), &c) in bundles.iter().zip(ranks).zip(checks).skip(1) {
        let lower = g.sub(rank, r);
        best = Bundle::pick(g, lower, b, &best);
        rank = g.select(lower, r, rank);
        check = g.select(lower, c, check);
    }
    (best, check)
}

/// [`MISMATCH`] when the turns `later` lie within `near` (sum of squared differences of
/// cosines and sines) of the turns of an `earlier` root that is real (its residual within
/// `tol2`): the later root is that root found again. Zero otherwise.
pub fn copy_penalty(
    g: &mut Graph,
    (earlier, residual): (&[(Id, Id)], Id),
    later: &[(Id, Id)],
    (near, tol2): (Id, Id),
) -> Id {
    let zero = g.constant(0.0);
    let mut d = zero;
    for (a, b) in earlier.iter().zip(later) {
        let dc = g.sub(a.0, b.0);
        let ds = g.sub(a.1, b.1);
        let dd = g.mul_add2(dc, dc, ds, ds);
        d = g.add(d, dd);
    }
    let same = g.sub(near, d);
    // Only a real earlier root makes this one a copy.
    let real = g.sub(tol2, residual);
    let same = g.min(same, real);
    let big = g.constant(MISMATCH);
    g.select(same, big, zero)
}

/// `residual` plus [`copy_penalty`] for each `earlier` root (its turns and its residual) that
/// the turns `later` repeat: the residual a root is routed with after the roots before it.
pub fn penalised<'a>(
    g: &mut Graph,
    residual: Id,
    earlier: impl IntoIterator<Item = (&'a [(Id, Id)], Id)>,
    later: &[(Id, Id)],
    thresholds: (Id, Id),
) -> Id {
    earlier.into_iter().fold(residual, |sum, before| {
        let penalty = copy_penalty(g, before, later, thresholds);
        g.add(sum, penalty)
    })
}

/// Routes `roots` (at most four) to the four [`SLOTS`]; `tol` is the length tolerance a real
/// root's residual is within.
pub fn route(g: &mut Graph, roots: &[Root], tol: f64) -> Vec<Slot> {
    let big = g.constant(MISMATCH);
    let zero = g.constant(0.0);
    let one = g.constant(1.0);
    let bundles: Vec<Bundle> = roots
        .iter()
        .enumerate()
        .map(|(i, r)| Bundle {
            values: r.values.clone(),
            residual: r.residual,
            which: [0, 1, 2, 3].map(|j| if j == i { one } else { zero }),
        })
        .collect();
    // Rank: unreal roots last.
    let unreal = g.constant(MISMATCH * 1e-10);
    let floor = g.exact(tol * tol);
    let base_rank: Vec<Id> = roots
        .iter()
        .map(|r| {
            let over = g.sub(r.residual, floor);
            let u = g.select(over, unreal, zero);
            g.add(u, r.rank)
        })
        .collect();
    // Pass 1: each slot's own roots.
    let mut first = Vec::new();
    for labels in SLOTS {
        let penalties: Vec<Id> = roots
            .iter()
            .map(|r| {
                let mut p = zero;
                for (&want, &sign) in labels.iter().zip(&r.labels) {
                    let s = if want { sign } else { g.neg(sign) };
                    let miss = g.select(s, zero, big);
                    p = g.add(p, miss);
                }
                p
            })
            .collect();
        let ranks: Vec<Id> = penalties
            .iter()
            .zip(&base_rank)
            .map(|(&p, &r)| g.add(p, r))
            .collect();
        let checks: Vec<Id> = penalties
            .iter()
            .zip(roots)
            .map(|(&p, r)| g.add(r.residual, p))
            .collect();
        first.push(smallest(g, &bundles, &ranks, &checks));
    }
    // Which roots pass 1 placed (a slot "has" its root when its score is below MISMATCH).
    let half_big = g.constant(MISMATCH / 2.0);
    let mut taken = [zero; 4];
    let mut has = Vec::new();
    for (b, score) in &first {
        let h = g.sub(half_big, *score);
        for (slot, &which) in taken.iter_mut().zip(&b.which) {
            let t = g.select(h, which, zero);
            *slot = g.add(*slot, t);
        }
        has.push(h);
    }
    // Pass 2: an empty slot takes the best root not yet taken.
    let mut out = Vec::new();
    for (s, labels) in SLOTS.into_iter().enumerate() {
        let penalties: Vec<Id> = taken.iter().map(|&t| g.mul(big, t)).collect();
        let ranks: Vec<Id> = penalties
            .iter()
            .zip(&base_rank)
            .map(|(&p, &r)| g.add(p, r))
            .collect();
        let checks: Vec<Id> = penalties
            .iter()
            .zip(&bundles)
            .map(|(&p, b)| g.add(b.residual, p))
            .collect();
        let (spare, spare_score) = smallest(g, &bundles, &ranks, &checks);
        let (own, own_score) = &first[s];
        let bundle = Bundle::pick(g, has[s], own, &spare);
        let score = g.select(has[s], *own_score, spare_score);
        // The spare root is taken now (only when this slot used it).
        let empty = g.neg(has[s]);
        for (slot, &which) in taken.iter_mut().zip(&spare.which) {
            let t = g.select(empty, which, zero);
            *slot = g.add(*slot, t);
        }
        out.push(Slot {
            values: bundle.values,
            score,
            labels,
        });
    }
    out
}
