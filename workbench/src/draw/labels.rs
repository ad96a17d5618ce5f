//! Placing short labels next to their marks without covering other marks or labels.

/// Boxes already taken in one view, px: `[left, top, right, bottom]`.
#[derive(Clone, Debug, Default)]
pub struct Occupancy {
    boxes: Vec<[f64; 4]>,
}

/// Where a label may go, relative to its mark, in the order tried.
const OFFSETS: [[f64; 2]; 8] = [
    [1.0, -1.0],
    [1.0, 1.0],
    [-1.0, -1.0],
    [-1.0, 1.0],
    [1.4, 0.0],
    [-1.4, 0.0],
    [0.0, -1.4],
    [0.0, 1.4],
];

/// Distances tried, as multiples of the requested one.
const RINGS: [f64; 3] = [1.0, 1.8, 2.6];

impl Occupancy {
    /// Marks a square of half-size `radius` about `centre` as taken.
    pub fn take(&mut self, centre: [f64; 2], radius: f64) {
        self.boxes.push([
            centre[0] - radius,
            centre[1] - radius,
            centre[0] + radius,
            centre[1] + radius,
        ]);
    }

    /// The centre for a label of `size` (width, height) next to `mark`, `distance` px clear of
    /// it: the first free place among eight around it, then eight further out (the first one
    /// if none is free). The place is taken.
    pub fn place(&mut self, mark: [f64; 2], distance: f64, size: [f64; 2]) -> [f64; 2] {
        let candidates: Vec<[f64; 2]> = RINGS
            .iter()
            .flat_map(|ring| {
                OFFSETS.map(|o| {
                    [
                        mark[0] + o[0] * (ring * distance + size[0] / 2.0),
                        mark[1] + o[1] * (ring * distance + size[1] / 2.0),
                    ]
                })
            })
            .collect();
        let chosen = candidates
            .iter()
            .copied()
            .find(|c| self.is_free(*c, size))
            .unwrap_or(candidates[0]);
        self.boxes.push(box_about(chosen, size));
        chosen
    }

    fn is_free(&self, centre: [f64; 2], size: [f64; 2]) -> bool {
        let b = box_about(centre, size);
        self.boxes
            .iter()
            .all(|o| b[2] <= o[0] || o[2] <= b[0] || b[3] <= o[1] || o[3] <= b[1])
    }
}

fn box_about(centre: [f64; 2], size: [f64; 2]) -> [f64; 4] {
    [
        centre[0] - size[0] / 2.0,
        centre[1] - size[1] / 2.0,
        centre[0] + size[0] / 2.0,
        centre[1] + size[1] / 2.0,
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_second_label_at_the_same_mark_goes_elsewhere() {
        let mut taken = Occupancy::default();
        taken.take([100.0, 100.0], 6.0);
        let a = taken.place([100.0, 100.0], 4.0, [8.0, 10.0]);
        let b = taken.place([100.0, 100.0], 4.0, [8.0, 10.0]);
        assert_ne!(a, b);
    }
}
