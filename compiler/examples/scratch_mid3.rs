use armforge_compiler::pipeline::load_and_classify;
use armforge_compiler::solver::Solver;
use std::path::Path;

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let (model, geometry) =
        load_and_classify(Path::new(&args[1]), &args[1], &Default::default()).unwrap();
    let solver = Solver::new(&model, &geometry);
    let q: Vec<f64> = args[2]
        .split(',')
        .map(|x| x.trim().parse::<f64>().unwrap())
        .collect();
    let q: [f64; 6] = q.try_into().unwrap();
    let pose = model.forward(&q);
    for s in solver.solve(&pose).unwrap() {
        println!(
            "{:?} {:?} {:?} branch_of={:?}",
            s.joints,
            s.branch,
            s.flags,
            solver.branch_of(&s.joints)
        );
        let p2 = model.forward(&s.joints);
        for s2 in solver.solve(&p2).unwrap() {
            println!("    {:?} {:?}", s2.joints, s2.branch);
        }
    }
}
