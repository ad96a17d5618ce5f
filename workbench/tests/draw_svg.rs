//! `armforge_workbench::draw`: the SVG parses, its viewBox holds the whole drawing, and what is
//! drawn sits where forward kinematics puts it.
//!
//! Expected positions are computed here independently of the library: joint centres of the
//! test arm are derived by hand from its axes (feet of common normals), and configurations are
//! applied with nalgebra's `Isometry3::rotation_wrt_point` (rotation about a line through a
//! point), not with armforge's own Rodrigues formula.

use armforge_compiler::diagnostics::Location;
use armforge_compiler::model::{Model, ModelJoint};
use armforge_compiler::units::{AngleUnit, LengthUnit, Units};
use armforge_runtime::{Joint, JointKind, Pose};
use armforge_workbench::draw::{Drawing, Panel};
use nalgebra::{Isometry3, Point3, Translation3, Unit, UnitQuaternion, Vector3};

/// An invented six-joint elbow arm for moving sample trays (millimetres, degrees):
/// waist about z, shoulder 150 mm out and 450 mm up, a 600 mm upper arm, a 120 mm elbow
/// offset, a 700 mm forearm to the wrist, a 100 mm flange.
fn tray_arm() -> Model {
    let revolute = |axis: [f64; 3], point: [f64; 3]| Joint {
        kind: JointKind::Revolute,
        axis,
        point,
        direction: 1.0,
        offset: 0.0,
        limits: [-3.0, 3.0],
    };
    let joints = [
        ("waist", revolute([0.0, 0.0, 1.0], [0.0, 0.0, 0.0])),
        ("shoulder", revolute([0.0, 1.0, 0.0], [0.15, 0.0, 0.45])),
        ("elbow", revolute([0.0, 1.0, 0.0], [0.15, 0.0, 1.05])),
        ("forearm roll", revolute([1.0, 0.0, 0.0], [0.3, 0.0, 1.17])),
        ("wrist bend", revolute([0.0, 1.0, 0.0], [0.85, 0.0, 1.17])),
        ("flange roll", revolute([1.0, 0.0, 0.0], [0.85, 0.0, 1.17])),
    ];
    Model {
        name: "tray_arm".to_string(),
        description: Some("Invented test arm".to_string()),
        units: Units {
            length: LengthUnit::Millimetre,
            angle: AngleUnit::Degree,
        },
        joints: joints
            .iter()
            .enumerate()
            .map(|(i, (name, joint))| ModelJoint {
                joint: *joint,
                name: name.to_string(),
                location: Location {
                    line: 1 + i,
                    column: 1,
                },
            })
            .collect(),
        // Tool z along +x (out of the flange), 100 mm past the wrist center.
        tool: Pose {
            rotation: [[0.0, 0.0, 1.0], [0.0, 1.0, 0.0], [-1.0, 0.0, 0.0]],
            translation: [0.95, 0.0, 1.17],
        },
        base: Pose::IDENTITY,
        source_path: "tray_arm.toml".to_string(),
    }
}

/// The joint centres of `tray_arm` at zero, derived by hand: joint 1 at the base origin; joint
/// 2 where the common normal of the z axis and the shoulder axis meets the shoulder axis;
/// joint 3 straight above it (parallel axes); joint 4 where the common normal from the elbow
/// axis meets the forearm axis; joints 5 and 6 at the wrist center.
const CENTRES_AT_ZERO: [[f64; 3]; 6] = [
    [0.0, 0.0, 0.0],
    [0.15, 0.0, 0.45],
    [0.15, 0.0, 1.05],
    [0.15, 0.0, 1.17],
    [0.85, 0.0, 1.17],
    [0.85, 0.0, 1.17],
];
const WRIST_CENTER: [f64; 3] = [0.85, 0.0, 1.17];

/// An invented gantry over a bench (millimetres, degrees): x, y and z slides 600 mm above the
/// floor, then a spherical wrist hanging from the z ram.
fn bench_gantry() -> Model {
    let joint = |kind, axis: [f64; 3], point: [f64; 3], limits: [f64; 2]| Joint {
        kind,
        axis,
        point,
        direction: 1.0,
        offset: 0.0,
        limits,
    };
    let (p, r) = (JointKind::Prismatic, JointKind::Revolute);
    let turn = [-3.0, 3.0];
    let joints = [
        (
            "x-slide",
            joint(p, [1.0, 0.0, 0.0], [0.0, 0.0, 0.6], [0.0, 0.8]),
        ),
        (
            "y-slide",
            joint(p, [0.0, 1.0, 0.0], [0.0, 0.0, 0.6], [-0.3, 0.3]),
        ),
        (
            "z-slide",
            joint(p, [0.0, 0.0, -1.0], [0.0, 0.0, 0.6], [0.0, 0.4]),
        ),
        (
            "wrist-turn",
            joint(r, [0.0, 0.0, -1.0], [0.0, 0.0, 0.5], turn),
        ),
        (
            "wrist-tilt",
            joint(r, [0.0, 1.0, 0.0], [0.0, 0.0, 0.45], turn),
        ),
        (
            "tool-spin",
            joint(r, [0.0, 0.0, -1.0], [0.0, 0.0, 0.45], turn),
        ),
    ];
    let mut model = tray_arm();
    model.name = "bench_gantry".to_string();
    for (mj, (name, j)) in model.joints.iter_mut().zip(joints) {
        mj.name = name.to_string();
        mj.joint = j;
    }
    model.tool = Pose {
        rotation: [[1.0, 0.0, 0.0], [0.0, -1.0, 0.0], [0.0, 0.0, -1.0]],
        translation: [0.0, 0.0, 0.38],
    };
    model
}

/// The gantry's joint centres at zero, derived by hand: the three slides meet at (0, 0, 600)
/// mm; the wrist turn sits where the file puts it on the ram's axis (collinear with the z
/// slide); the tilt and spin axes meet at the wrist center.
const GANTRY_CENTRES_AT_ZERO: [[f64; 3]; 6] = [
    [0.0, 0.0, 0.6],
    [0.0, 0.0, 0.6],
    [0.0, 0.0, 0.6],
    [0.0, 0.0, 0.5],
    [0.0, 0.0, 0.45],
    [0.0, 0.0, 0.45],
];

/// `E_1 ⋯ E_k` for the first `k` joints, with nalgebra.
fn chain(model: &Model, q: &[f64], k: usize) -> Isometry3<f64> {
    let mut t = Isometry3::identity();
    for (joint, &value) in model.joints.iter().zip(q).take(k) {
        let j = &joint.joint;
        let axis = Unit::new_normalize(Vector3::from(j.axis));
        let amount = j.direction * value + j.offset;
        t *= match j.kind {
            JointKind::Revolute => Isometry3::rotation_wrt_point(
                UnitQuaternion::from_axis_angle(&axis, amount),
                Point3::from(j.point),
            ),
            JointKind::Prismatic => {
                Isometry3::translation(amount * axis.x, amount * axis.y, amount * axis.z)
            }
        };
    }
    t
}

fn world(model: &Model, q: &[f64], k: usize, p: [f64; 3]) -> [f64; 3] {
    let b = &model.base;
    let base = Isometry3::from_parts(
        Translation3::from(Vector3::from(b.translation)),
        UnitQuaternion::from_matrix(&nalgebra::Matrix3::from_row_slice(&b.rotation.concat())),
    );
    let w = base * chain(model, q, k) * Point3::from(p);
    [w.x, w.y, w.z]
}

/// A view as the SVG describes it.
struct View {
    kind: String,
    panel: usize,
    scale: f64,
    origin: [f64; 2],
}

impl View {
    fn of(node: roxmltree::Node) -> View {
        let f = |name: &str| node.attribute(name).unwrap().parse::<f64>().unwrap();
        View {
            kind: node.attribute("data-view").unwrap().to_string(),
            panel: node.attribute("data-panel").unwrap().parse().unwrap(),
            scale: f("data-scale"),
            origin: [f("data-origin-x"), f("data-origin-y")],
        }
    }

    /// The world point on the page, px: side = x–z, top = x–y, end = y–z, SVG y downwards.
    fn expected(&self, p: [f64; 3]) -> [f64; 2] {
        let (u, v) = match self.kind.as_str() {
            "side" => (p[0], p[2]),
            "top" => (p[0], p[1]),
            "end" => (p[1], p[2]),
            other => panic!("unknown view {other}"),
        };
        [
            self.origin[0] + self.scale * u,
            self.origin[1] - self.scale * v,
        ]
    }
}

fn number(node: roxmltree::Node, name: &str) -> f64 {
    node.attribute(name).unwrap().parse().unwrap()
}

fn has_class(node: &roxmltree::Node, class: &str) -> bool {
    node.attribute("class")
        .is_some_and(|c| c.split(' ').any(|w| w == class))
}

/// The centre of a joint mark (a circle, or a square given by its corner).
fn joint_centre(mark: roxmltree::Node) -> [f64; 2] {
    let shape = mark.children().find(|c| c.is_element()).unwrap();
    match shape.tag_name().name() {
        "circle" => [number(shape, "cx"), number(shape, "cy")],
        "rect" => [
            number(shape, "x") + number(shape, "width") / 2.0,
            number(shape, "y") + number(shape, "height") / 2.0,
        ],
        other => panic!("unexpected joint shape {other}"),
    }
}

/// Drawing precision: coordinates are written with two decimals.
const PRECISION_PX: f64 = 0.011;

fn assert_near(drawn: [f64; 2], expected: [f64; 2], what: &str) {
    let d = ((drawn[0] - expected[0]).powi(2) + (drawn[1] - expected[1]).powi(2)).sqrt();
    assert!(
        d <= PRECISION_PX,
        "{what}: drawn at {drawn:?}, forward kinematics gives {expected:?} ({d:.4} px off)"
    );
}

fn degrees(q: [f64; 6]) -> Vec<f64> {
    q.iter().map(|d| d.to_radians()).collect()
}

#[test]
fn joint_centres_match_forward_kinematics_in_every_view() {
    let model = tray_arm();
    let q = degrees([35.0, -40.0, 70.0, 20.0, -50.0, 15.0]);
    let svg = Drawing::configuration(&model, q.clone()).to_svg();
    let doc = roxmltree::Document::parse(&svg).expect("the drawing is well-formed XML");
    let mut checked = 0;
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let view = View::of(view_node);
        for mark in view_node.descendants().filter(|n| has_class(n, "joint")) {
            let i: usize = mark.attribute("data-joint").unwrap().parse().unwrap();
            // Joint i's centre moves with the joints before it: E_1 ⋯ E_{i−1}.
            let expected = view.expected(world(&model, &q, i - 1, CENTRES_AT_ZERO[i - 1]));
            assert_near(
                joint_centre(mark),
                expected,
                &format!("{} view, joint {i}", view.kind),
            );
            checked += 1;
        }
    }
    assert_eq!(checked, 3 * 6, "three views of six joints");
}

#[test]
fn slide_carriages_sit_where_their_slides_put_them() {
    // A prismatic joint is drawn at its carriage: its centre moved by the joints before it and
    // by its own slide (E_1 ⋯ E_i); for revolute joints E_i leaves the centre in place.
    let model = bench_gantry();
    let q = vec![0.5, 0.15, 0.2, 0.5, 0.8, 0.0];
    let svg = Drawing::configuration(&model, q.clone()).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let mut squares = 0;
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let view = View::of(view_node);
        for mark in view_node.descendants().filter(|n| has_class(n, "joint")) {
            let i: usize = mark.attribute("data-joint").unwrap().parse().unwrap();
            let expected = view.expected(world(&model, &q, i, GANTRY_CENTRES_AT_ZERO[i - 1]));
            assert_near(
                joint_centre(mark),
                expected,
                &format!("{} view, joint {i}", view.kind),
            );
            if mark.attribute("data-kind") == Some("prismatic") {
                squares += 1;
            }
        }
    }
    assert_eq!(squares, 3 * 3);
}

#[test]
fn tool_origin_and_wrist_center_match_forward_kinematics() {
    let model = tray_arm();
    let q = degrees([-120.0, 25.0, -35.0, 90.0, 60.0, -170.0]);
    let svg = Drawing::configuration(&model, q.clone()).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let tool = world(&model, &q, 6, model.tool.translation);
    // The library's own forward kinematics agrees with the nalgebra chain.
    let fk = model.forward(&q).translation;
    for k in 0..3 {
        assert!((fk[k] - tool[k]).abs() < 1e-12);
    }
    let wrist = world(&model, &q, 6, WRIST_CENTER);
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let view = View::of(view_node);
        let origin = view_node
            .descendants()
            .find(|n| has_class(n, "tool-origin"))
            .unwrap();
        assert_near(
            [number(origin, "cx"), number(origin, "cy")],
            view.expected(tool),
            &format!("{} view, tool origin", view.kind),
        );
        let diamond = view_node
            .descendants()
            .find(|n| has_class(n, "wrist-center"))
            .unwrap();
        let corners: Vec<[f64; 2]> = diamond
            .attribute("points")
            .unwrap()
            .split(' ')
            .map(|p| {
                let (x, y) = p.split_once(',').unwrap();
                [x.parse().unwrap(), y.parse().unwrap()]
            })
            .collect();
        let centre = [
            corners.iter().map(|c| c[0]).sum::<f64>() / 4.0,
            corners.iter().map(|c| c[1]).sum::<f64>() / 4.0,
        ];
        assert_near(
            centre,
            view.expected(wrist),
            &format!("{} view, wrist center", view.kind),
        );
    }
}

/// Every coordinate written on any element.
fn coordinates(doc: &roxmltree::Document) -> Vec<[f64; 2]> {
    let mut out = Vec::new();
    for n in doc.descendants().filter(|n| n.is_element()) {
        let get = |name: &str| n.attribute(name).and_then(|v| v.parse::<f64>().ok());
        for (x, y) in [("x", "y"), ("x1", "y1"), ("x2", "y2"), ("cx", "cy")] {
            if let (Some(x), Some(y)) = (get(x), get(y)) {
                out.push([x, y]);
            }
        }
        if let (Some(x), Some(y), Some(w), Some(h)) =
            (get("x"), get("y"), get("width"), get("height"))
        {
            out.push([x + w, y + h]);
        }
        if let Some(points) = n.attribute("points") {
            for p in points.split(' ') {
                let (x, y) = p.split_once(',').unwrap();
                out.push([x.parse().unwrap(), y.parse().unwrap()]);
            }
        }
    }
    out
}

fn view_box(doc: &roxmltree::Document) -> [f64; 4] {
    let v: Vec<f64> = doc
        .root_element()
        .attribute("viewBox")
        .unwrap()
        .split(' ')
        .map(|s| s.parse().unwrap())
        .collect();
    [v[0], v[1], v[2], v[3]]
}

#[test]
fn view_box_holds_every_drawn_point_and_each_view_its_arm() {
    let model = tray_arm();
    for q in [
        [0.0; 6],
        [90.0, -80.0, 150.0, 0.0, 90.0, 0.0],
        [-170.0, 60.0, -150.0, 45.0, -120.0, 30.0],
    ] {
        let svg = Drawing::configuration(&model, degrees(q)).to_svg();
        let doc = roxmltree::Document::parse(&svg).unwrap();
        let [x0, y0, w, h] = view_box(&doc);
        let points = coordinates(&doc);
        assert!(points.len() > 100);
        for p in points {
            assert!(
                p[0] >= x0 && p[0] <= x0 + w && p[1] >= y0 && p[1] <= y0 + h,
                "{p:?} lies outside the viewBox {x0} {y0} {w} {h} at q = {q:?}"
            );
        }
        // Each view's frame holds its links.
        for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
            let frame = view_node
                .descendants()
                .find(|n| n.tag_name().name() == "rect")
                .unwrap();
            let (left, top) = (number(frame, "x"), number(frame, "y"));
            let (right, bottom) = (left + number(frame, "width"), top + number(frame, "height"));
            let links = view_node
                .descendants()
                .find(|n| has_class(n, "links"))
                .unwrap();
            for p in links.attribute("points").unwrap().split(' ') {
                let (x, y) = p.split_once(',').unwrap();
                let (x, y): (f64, f64) = (x.parse().unwrap(), y.parse().unwrap());
                assert!(x > left && x < right && y > top && y < bottom);
            }
        }
    }
}

#[test]
fn the_same_input_gives_the_same_bytes() {
    let model = tray_arm();
    let q = degrees([10.0, 20.0, 30.0, 40.0, 50.0, 60.0]);
    let a = Drawing::configuration(&model, q.clone()).to_svg();
    let b = Drawing::configuration(&model, q).to_svg();
    assert_eq!(a, b);
}

#[test]
fn the_scale_bar_is_drawn_to_the_views_scale_in_the_files_unit() {
    let model = tray_arm();
    let svg = Drawing::configuration(&model, vec![0.0; 6]).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let bar = doc
        .descendants()
        .find(|n| has_class(n, "scale-bar"))
        .unwrap();
    let label = bar.attribute("data-length").unwrap();
    let millimetres: f64 = label
        .strip_suffix(" mm")
        .expect("millimetres")
        .parse()
        .unwrap();
    // A round length: 1, 2 or 5 times a power of ten.
    let mantissa = millimetres / 10f64.powf(millimetres.log10().floor());
    assert!(
        [1.0, 2.0, 5.0].iter().any(|m| (mantissa - m).abs() < 1e-9),
        "{label}"
    );
    let px: f64 = number(bar, "data-length-px");
    assert!(px >= 60.0, "a readable bar: {px} px");
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let scale = View::of(view_node).scale;
        assert!((px - millimetres / 1000.0 * scale).abs() < 0.01);
    }
}

#[test]
fn a_positive_shoulder_value_tips_the_arm_forward_and_a_flipped_sign_backward() {
    // Right-hand rule about +y: a positive rotation takes +z towards +x (the rotation matrix
    // about y, Craig, Introduction to Robotics, 3rd ed., 2005, §2.6, from memory). With the
    // shoulder's direction flipped, the same joint value tips the arm the other way, and the
    // side view shows it.
    let mut model = tray_arm();
    let q = degrees([0.0, 30.0, 0.0, 0.0, 0.0, 0.0]);
    let elbow_x = |model: &Model| {
        let svg = Drawing::configuration(model, q.clone()).to_svg();
        let doc = roxmltree::Document::parse(&svg).unwrap();
        let side = doc
            .descendants()
            .find(|n| has_class(n, "view") && n.attribute("data-view") == Some("side"))
            .unwrap();
        let centre = |i: &str| {
            joint_centre(
                side.descendants()
                    .find(|n| has_class(n, "joint") && n.attribute("data-joint") == Some(i))
                    .unwrap(),
            )
        };
        centre("3")[0] - centre("2")[0]
    };
    assert!(elbow_x(&model) > 50.0);
    model.joints[1].joint.direction = -1.0;
    assert!(elbow_x(&model) < -50.0);
}

#[test]
fn axes_along_the_line_of_sight_are_marked_toward_or_away() {
    // Side view is seen from −y: the shoulder's +y axis points away from the viewer (⊗).
    // Top view is seen from +z: the waist's +z axis points at the viewer (⊙).
    let model = tray_arm();
    let svg = Drawing::configuration(&model, vec![0.0; 6]).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let mark = |view: &str, joint: &str| {
        let v = doc
            .descendants()
            .find(|n| has_class(n, "view") && n.attribute("data-view") == Some(view))
            .unwrap();
        let j = v
            .descendants()
            .find(|n| has_class(n, "joint") && n.attribute("data-joint") == Some(joint))
            .unwrap();
        let end_on = j.descendants().find(|n| has_class(n, "end-on"));
        end_on.map(|n| {
            if has_class(&n, "toward") {
                "toward"
            } else {
                "away"
            }
        })
    };
    assert_eq!(mark("side", "2"), Some("away"));
    assert_eq!(mark("top", "1"), Some("toward"));
    assert_eq!(
        mark("side", "1"),
        None,
        "the waist axis lies in the side view's plane"
    );
}

#[test]
fn a_solutions_drawing_has_one_labelled_panel_per_configuration() {
    let model = tray_arm();
    let configurations = [
        ("elbow up", [10.0, -20.0, 40.0, 0.0, 30.0, 0.0]),
        ("elbow down", [10.0, 30.0, -40.0, 0.0, 60.0, 0.0]),
        ("reaching back", [-170.0, -30.0, 140.0, 0.0, -10.0, 0.0]),
    ];
    let panels: Vec<Panel> = configurations
        .iter()
        .map(|(label, q)| Panel {
            caption: label.to_string(),
            joint_values: degrees(*q),
            alternatives: Vec::new(),
        })
        .collect();
    let target = model.forward(&degrees(configurations[0].1));
    let svg = Drawing::solutions(&model, target, panels).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let captions: Vec<String> = doc
        .descendants()
        .filter(|n| has_class(n, "caption"))
        .map(|n| {
            n.descendants()
                .find(|t| t.tag_name().name() == "text")
                .unwrap()
                .text()
                .unwrap()
                .trim()
                .to_string()
        })
        .collect();
    assert_eq!(captions, ["elbow up", "elbow down", "reaching back"]);
    let views: Vec<View> = doc
        .descendants()
        .filter(|n| has_class(n, "view"))
        .map(View::of)
        .collect();
    assert_eq!(views.len(), 6);
    for (p, (_, q)) in configurations.iter().enumerate() {
        let kinds: Vec<&str> = views
            .iter()
            .filter(|v| v.panel == p)
            .map(|v| v.kind.as_str())
            .collect();
        assert_eq!(kinds, ["side", "top"]);
        let q = degrees(*q);
        let tool = world(&model, &q, 6, model.tool.translation);
        for view_node in doc
            .descendants()
            .filter(|n| has_class(n, "view") && n.attribute("data-panel") == Some(&p.to_string()))
        {
            let view = View::of(view_node);
            let origin = view_node
                .descendants()
                .find(|n| has_class(n, "tool-origin"))
                .unwrap();
            assert_near(
                [number(origin, "cx"), number(origin, "cy")],
                view.expected(tool),
                "tool origin",
            );
        }
    }
    // Every panel is drawn to one scale.
    assert!(views
        .iter()
        .all(|v| (v.scale - views[0].scale).abs() < 1e-9));
}

/// An invented standard-DH arm (mm, degrees): `[a, alpha, d, theta]` per joint.
const DH_TABLE: [[f64; 4]; 6] = [
    [50.0, 90.0, 400.0, 0.0],
    [350.0, 0.0, 0.0, 90.0],
    [40.0, 90.0, 0.0, 0.0],
    [0.0, -90.0, 380.0, 0.0],
    [0.0, 90.0, 0.0, 0.0],
    [0.0, 0.0, 90.0, 0.0],
];

fn dh_file() -> String {
    let mut text = String::from(
        "name = \"dh-check\"\nlength_unit = \"mm\"\nangle_unit = \"deg\"\nconvention = \"dh\"\n",
    );
    for [a, alpha, d, theta] in DH_TABLE {
        text.push_str(&format!(
            "\n[[joint]]\ntype = \"revolute\"\nlimits = [-360, 360]\na = {a}\nalpha = {alpha}\nd = {d}\ntheta = {theta}\n"
        ));
    }
    text
}

#[test]
fn joint_centres_of_a_dh_arm_are_its_frame_origins() {
    // In standard DH, frame i−1's origin is where the common normal from axis z_{i−2} meets
    // axis z_{i−1}, the axis of joint i (Spong, Hutchinson & Vidyasagar, Robot Modeling and
    // Control, 2006, §3.2, from memory) — the point the drawing calls joint i's centre. The
    // frames are chained here with nalgebra from the table, A_i = Rz(θ)·Tz(d)·Tx(a)·Rx(α),
    // independently of armforge's reader and model.
    let model = armforge_compiler::description::load_str(&dh_file(), "dh-check.toml")
        .expect("the DH file loads");
    let q_deg = [25.0, -35.0, 50.0, 40.0, -60.0, 120.0];
    let svg = Drawing::configuration(&model, degrees(q_deg)).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let mut origins = vec![[0.0; 3]];
    let mut t = Isometry3::identity();
    for ([a, alpha, d, theta], q) in DH_TABLE.iter().zip(q_deg) {
        let z = Vector3::z_axis();
        let x = Vector3::x_axis();
        t =
            t * Isometry3::from_parts(
                Translation3::new(0.0, 0.0, d / 1000.0),
                UnitQuaternion::from_axis_angle(&z, (theta + q).to_radians()),
            ) * Isometry3::from_parts(
                Translation3::new(a / 1000.0, 0.0, 0.0),
                UnitQuaternion::from_axis_angle(&x, alpha.to_radians()),
            );
        origins.push([t.translation.x, t.translation.y, t.translation.z]);
    }
    let mut checked = 0;
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let view = View::of(view_node);
        for mark in view_node.descendants().filter(|n| has_class(n, "joint")) {
            let i: usize = mark.attribute("data-joint").unwrap().parse().unwrap();
            let what = format!("{} view, joint {i} at DH origin {}", view.kind, i - 1);
            assert_near(joint_centre(mark), view.expected(origins[i - 1]), &what);
            checked += 1;
        }
    }
    assert_eq!(checked, 18);
}

/// The hotel loader's joint centres at zero, derived by hand from `arms/hotel-loader-axes.toml`:
/// the turn axis (z through the origin) at the origin; the tilt axis (y through
/// (0.12, 0, 0.62)) at the foot of its common normal with the turn axis; the boom (a slide
/// along z, no point in the file) where it leaves the tilt axis on its way to the wrist; the
/// three wrist axes where they meet, 0.55 m up the boom.
const HOTEL_CENTRES_AT_ZERO: [[f64; 3]; 6] = [
    [0.0, 0.0, 0.0],
    [0.12, 0.0, 0.62],
    [0.12, 0.0, 0.62],
    [0.12, 0.0, 1.17],
    [0.12, 0.0, 1.17],
    [0.12, 0.0, 1.17],
];

#[test]
fn the_polar_boom_runs_from_its_tilt_axis_where_forward_kinematics_puts_it() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/../arms/hotel-loader-axes.toml"
    );
    let text = std::fs::read_to_string(path).expect("the hotel loader example");
    let model = armforge_compiler::description::load_str(&text, path).expect("loads");
    let q = vec![
        30f64.to_radians(),
        40f64.to_radians(),
        0.25,
        10f64.to_radians(),
        20f64.to_radians(),
        30f64.to_radians(),
    ];
    let svg = Drawing::configuration(&model, q.clone()).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let mut checked = 0;
    for view_node in doc.descendants().filter(|n| has_class(n, "view")) {
        let view = View::of(view_node);
        for mark in view_node.descendants().filter(|n| has_class(n, "joint")) {
            let i: usize = mark.attribute("data-joint").unwrap().parse().unwrap();
            // E_i leaves a turning joint's centre in place and moves a slide's carriage.
            let expected = view.expected(world(&model, &q, i, HOTEL_CENTRES_AT_ZERO[i - 1]));
            assert_near(
                joint_centre(mark),
                expected,
                &format!("{} view, joint {i}", view.kind),
            );
            checked += 1;
        }
    }
    assert_eq!(checked, 3 * 6, "three views of six joints");
}

#[test]
fn the_title_and_the_subject_are_apart_in_every_viewer() {
    // SVG collapses leading spaces in a text span (SVG 1.1 §10.15, `xml:space`), so the gap
    // between the arm's name and the subject must be a shift, not spaces.
    let svg = Drawing::configuration(&tray_arm(), vec![0.0; 6]).to_svg();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let title = doc
        .descendants()
        .find(|n| has_class(n, "title"))
        .expect("a title group");
    let spans: Vec<_> = title
        .descendants()
        .filter(|n| n.tag_name().name() == "tspan")
        .collect();
    assert_eq!(spans.len(), 2, "name and subject");
    let subject = spans[1];
    assert!(number(subject, "dx") > 0.0);
    let words = subject.text().unwrap_or_default();
    assert!(words.starts_with('—'), "{words:?}");
}
