//! Long engine work for the browser, run off the page's thread in a web worker: an option
//! sweep (one row at a time, each row posted as it is made, so the page shows progress),
//! the key numbers of saved options (each sized, `arch::options::key_numbers`), and goal
//! seek on the rise (`arch::seek`; the least-cost goal sizes every rise it tries), the
//! files made of a design (`export`), and the reading of a design file
//! (`arch::design_file`; the page carries no reader of its own, which would be about a
//! ninth of its bundle).
//!
//! The page and the worker talk in JSON text: the page posts one [`Request`], the worker
//! posts [`Reply`] values back (first [`Reply::Ready`] once loaded). Designs travel to the
//! worker as their design links (`link::permalink`), so the worker reads them with the
//! same checks as a pasted link; a design file's design comes back as transfer text
//! (`permalink::to_transfer`: a file may hold more than a link's caps allow). Cancelling
//! is the page's: it ends the worker and starts a new one for the next request. This
//! crate only translates; the mathematics is the engine's.

use serde::{Deserialize, Serialize};
use springline_statics::arch::design_file::read_design_json;
use springline_statics::arch::options::{key_numbers, KeyNumbers};
use springline_statics::arch::seek::{seek, Goal};
use springline_statics::arch::sweep::{sweep_each, Axis, Sweep, SweepRow};
use springline_statics::export::{export, Export};
use springline_statics::link::permalink;

/// What the page asks of the worker.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum Request {
    /// The key numbers (sized) of each design, given as design links.
    KeyNumbers {
        /// Design links (`s2.xxxx`).
        links: Vec<String>,
    },
    /// An option sweep of one design (sized when `size`).
    Sweep {
        /// The design's link.
        link: String,
        /// One axis, or two as a grid.
        axes: Vec<Axis>,
        /// Size every option.
        size: bool,
    },
    /// A file of the design (`springline_statics::export`).
    Export {
        /// The design's link.
        link: String,
        /// Which file.
        export: Export,
    },
    /// A design file's text read into its design, sent back as transfer text.
    Open {
        /// The file's text (JSON, any design-file version).
        text: String,
    },
    /// The rise of a design that meets one goal.
    Seek {
        /// The design's link.
        link: String,
        /// The goal.
        goal: Goal,
    },
}

/// What the worker tells the page.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum Reply {
    /// Loaded and listening.
    Ready,
    /// One design's key numbers (`index` into the request's links).
    Numbers {
        /// Which link.
        index: usize,
        /// Its key numbers.
        numbers: KeyNumbers,
    },
    /// One option of a sweep is done (`done` of `total`, counting from 1).
    Row {
        /// Options done.
        done: usize,
        /// Options in all.
        total: usize,
        /// The option's row.
        row: SweepRow,
    },
    /// The whole sweep (its rows, axes and what stayed fixed).
    Swept {
        /// The sweep.
        sweep: Sweep,
    },
    /// What a seek found: whether the goal is met, the outcome in words, the designs
    /// tried, and the design at the rise found (or the nearest) as its link.
    Sought {
        /// Whether a rise meets the goal.
        met: bool,
        /// The outcome in words.
        message: String,
        /// Designs evaluated.
        evaluations: usize,
        /// The design found, as its link.
        link: String,
    },
    /// A file made: its name and its text.
    Exported {
        /// A file name from the design's name and the export's ending.
        file_name: String,
        /// The file's text.
        text: String,
    },
    /// A design file read: the design it holds (not validated: the page checks it as an
    /// edit).
    Opened {
        /// The design as `permalink::to_transfer` text (every field kept bit for bit, no
        /// link's caps on its size).
        design: String,
    },
    /// The request could not be carried out; the words say why.
    Failed {
        /// Why, for the user.
        message: String,
    },
}

/// Carries out `request`, posting each reply as it comes (`post`). Never panics on any
/// request: a design link that does not open, a bad sweep axis or an option that fails
/// become a `Failed` reply or a row with its reason.
pub fn run(request: Request, post: &mut dyn FnMut(Reply)) {
    match request {
        Request::KeyNumbers { links } => {
            for (index, link) in links.iter().enumerate() {
                let numbers = match permalink::decode(link) {
                    Ok(design) => key_numbers(&design, true),
                    Err(e) => KeyNumbers {
                        reason: Some(format!("cannot read the option: {e}")),
                        ..KeyNumbers::default()
                    },
                };
                post(Reply::Numbers { index, numbers });
            }
        }
        Request::Sweep { link, axes, size } => {
            let design = match permalink::decode(&link) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            let swept = sweep_each(&design, &axes, size, |done, total, row| {
                post(Reply::Row { done, total, row: row.clone() });
                true
            });
            match swept {
                Ok(sweep) => post(Reply::Swept { sweep }),
                Err(e) => post(Reply::Failed { message: e.to_string() }),
            }
        }
        Request::Export { link, export: what } => {
            let design = match permalink::decode(&link) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            match export(&design, what) {
                Ok(text) => post(Reply::Exported { file_name: what.file_name(&design.name), text }),
                Err(e) => post(Reply::Failed { message: e.to_string() }),
            }
        }
        Request::Open { text } => match read_design_json(&text) {
            Ok(design) => post(Reply::Opened { design: permalink::to_transfer(&design) }),
            Err(e) => post(Reply::Failed { message: e.to_string() }),
        },
        Request::Seek { link, goal } => {
            let design = match permalink::decode(&link) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            match seek(&design, goal) {
                Ok(r) => post(Reply::Sought {
                    met: r.met,
                    message: r.message,
                    evaluations: r.evaluations,
                    link: permalink::encode(&r.design),
                }),
                Err(e) => post(Reply::Failed { message: e.to_string() }),
            }
        }
    }
}

/// Carries out a request given as JSON text and returns each reply as JSON text (what
/// the worker posts). A text that is not a request gives one `Failed` reply.
pub fn run_text(request: &str, post: &mut dyn FnMut(String)) {
    let mut send = |reply: Reply| post(serde_json::to_string(&reply).unwrap_or_default());
    match serde_json::from_str::<Request>(request) {
        Ok(request) => run(request, &mut send),
        Err(e) => send(Reply::Failed {
            message: format!("the page sent the worker a request it cannot read ({e})"),
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::arch::sweep::{parse_axis, sweep};
    use springline_statics::Design;

    fn replies(request: &Request) -> Vec<Reply> {
        let mut out = Vec::new();
        run_text(&serde_json::to_string(request).expect("json"), &mut |text| {
            out.push(serde_json::from_str(&text).expect("a reply"))
        });
        out
    }

    #[test]
    fn a_sweep_posts_every_row_then_the_same_sweep_the_engine_makes() {
        let design = Design::demo();
        let axes = vec![parse_axis("rise-ratio=0.12:0.2:3").expect("axis")];
        let out =
            replies(&Request::Sweep { link: permalink::encode(&design), axes: axes.clone(), size: false });
        assert_eq!(out.len(), 4);
        let expected = sweep(&design, &axes, false).expect("sweeps");
        for (k, reply) in out[..3].iter().enumerate() {
            assert_eq!(*reply, Reply::Row { done: k + 1, total: 3, row: expected.rows[k].clone() });
        }
        assert_eq!(out[3], Reply::Swept { sweep: expected });
    }

    #[test]
    fn key_numbers_follow_the_engine_and_a_bad_link_is_a_reason() {
        let design = Design::demo();
        let out = replies(&Request::KeyNumbers { links: vec![permalink::encode(&design), "s2.AAAA".into()] });
        assert_eq!(out.len(), 2);
        assert_eq!(out[0], Reply::Numbers { index: 0, numbers: key_numbers(&design, true) });
        let Reply::Numbers { index: 1, numbers } = &out[1] else { panic!("{:?}", out[1]) };
        assert!(!numbers.feasible);
        assert!(
            numbers.reason.as_deref().is_some_and(|r| r.starts_with("cannot read the option")),
            "{numbers:?}"
        );
    }

    #[test]
    fn a_seek_posts_the_engines_design_as_its_link() {
        let design = Design::demo();
        let goal = Goal::MaxThrust { thrust: 7500.0 };
        let out = replies(&Request::Seek { link: permalink::encode(&design), goal });
        let found = seek(&design, goal).expect("seeks");
        assert_eq!(
            out,
            [Reply::Sought {
                met: true,
                message: found.message,
                evaluations: found.evaluations,
                link: permalink::encode(&found.design)
            }]
        );
        let refused = replies(&Request::Seek {
            link: permalink::encode(&design),
            goal: Goal::MaxThrust { thrust: -1.0 },
        });
        assert!(
            matches!(&refused[0], Reply::Failed { message } if message.contains("positive")),
            "{refused:?}"
        );
    }

    #[test]
    fn an_export_is_the_engines_file_with_its_name() {
        let design = Design::demo();
        let out = replies(&Request::Export { link: permalink::encode(&design), export: Export::MemberTable });
        let text = export(&design, Export::MemberTable).expect("exports");
        assert_eq!(
            out,
            [Reply::Exported { file_name: "tarnvale-gorge-road-bridge-members.csv".into(), text }]
        );
    }

    /// A design file comes back as its design, every field kept (the page reads the
    /// transfer text); a file that is not a design says why, as the engine's reader does.
    #[test]
    fn a_design_file_comes_back_as_its_designs_link_or_the_readers_reason() {
        let mut design = Design::demo();
        design.panels = 14;
        design.name = "Tamsin Fold footbridge".into();
        let text = springline_statics::arch::design_file::write_design_json(&design);
        let out = replies(&Request::Open { text });
        let [Reply::Opened { design: text }] = out.as_slice() else { panic!("{out:?}") };
        assert_eq!(permalink::from_transfer(text), Ok(design));
        let broken = "{\"version\": 7, \"name\": ";
        let expected = read_design_json(broken).expect_err("not a design").to_string();
        assert_eq!(
            replies(&Request::Open { text: broken.into() }),
            vec![Reply::Failed { message: expected }]
        );
    }

    #[test]
    fn bad_requests_are_failures_not_panics() {
        let mut out = Vec::new();
        run_text("{\"Sweep\": 3}", &mut |t| out.push(t));
        assert!(out[0].contains("Failed"), "{out:?}");
        let bad = replies(&Request::Sweep { link: "nonsense".into(), axes: vec![], size: false });
        assert!(
            matches!(&bad[0], Reply::Failed { message } if message.starts_with("cannot read the design"))
        );
        let no_axis =
            replies(&Request::Sweep { link: permalink::encode(&Design::demo()), axes: vec![], size: false });
        assert!(matches!(&no_axis[0], Reply::Failed { message } if message.contains("varies one parameter")));
    }
}
