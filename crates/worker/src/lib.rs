//! Long engine work for the browser, run off the page's thread in a web worker: an option
//! sweep or one share of it (one row at a time, each row posted as it is made, so the page
//! shows progress; the page gives each of several workers a share),
//! the key numbers of saved options (each sized, `arch::options::key_numbers`), and goal
//! seek on the rise (`arch::seek`; the least-cost goal sizes every rise it tries), the
//! files made of a design (`export`), the reading of a design file
//! (`arch::design_file`; the page carries no reader of its own, which would be about a
//! ninth of its bundle), and the results the page shows once edits pause: the traffic
//! envelopes of the frame model, the stability under the dead load and, while the sizing
//! view is on, the size report, and the massing loop on request (together about 0.1 s at 16 panels in the browser and
//! seconds at 64: on the page's thread they were a pause a click could fall into).
//!
//! The page posts one [`Request`] as JSON text; the worker posts [`Reply`] values back
//! (first [`Reply::Ready`] once loaded) as postcard bytes ([`reply_bytes`],
//! [`read_reply`]): the page then carries postcard's small reader of the reports rather
//! than JSON's, about a tenth of its bundle, and every number arrives bit for bit
//! (infinities too). Designs travel to the
//! worker as their design links (`link::permalink`), so the worker reads them with the
//! same checks as a pasted link; a design file's design comes back as transfer text
//! (`permalink::to_transfer`: a file may hold more than a link's caps allow). Cancelling
//! is the page's: it ends the worker and starts a new one for the next request. This
//! crate only translates; the mathematics is the engine's.

use serde::{Deserialize, Serialize};
use springline_statics::arch::design_file::read_design_json;
use springline_statics::arch::massing::massing_loop;
use springline_statics::arch::options::{key_numbers, KeyNumbers};
use springline_statics::arch::seek::{seek, Goal};
use springline_statics::arch::sizing::{size_design, SizeReport};
use springline_statics::arch::stability::{arch_stability, ArchStability};
use springline_statics::arch::sweep::{sweep_share, Axis, Share, Sweep, SweepRow};
use springline_statics::arch::traffic::{traffic_envelopes, TrafficReport};
use springline_statics::export::{export, Export};
use springline_statics::link::permalink;
use springline_statics::{Design, ModelKind, ValidDesign};

/// What the page asks of the worker.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum Request {
    /// The key numbers (sized) of each design, given as design links.
    KeyNumbers {
        /// Design links (`s2.xxxx`).
        links: Vec<String>,
    },
    /// An option sweep of one design (sized when `size`), or the share of it one of
    /// several workers sweeping at once takes.
    Sweep {
        /// The design's link.
        link: String,
        /// One axis, or two as a grid.
        axes: Vec<Axis>,
        /// Size every option.
        size: bool,
        /// Which options (every one: `Share::WHOLE`).
        share: Share,
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
    /// The results shown once edits pause: the traffic report, then the stability, then
    /// when `size` the size report (`Reply::Traffic`, `Reply::Stability`, `Reply::Sized`).
    Settled {
        /// The design as `permalink::to_transfer` text (a design opened from a file may
        /// be larger than a link allows).
        design: String,
        /// How many modes of each kind the stability finds.
        modes: usize,
        /// Size the design too.
        size: bool,
    },
    /// The massing loop (`arch::massing::massing_loop`) from a design.
    Massing {
        /// The design as `permalink::to_transfer` text.
        design: String,
        /// At most this many passes.
        passes: usize,
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
    /// One option of a sweep is done.
    Row {
        /// Its place among the whole sweep's rows, from 0 (a share's rows skip the other
        /// shares').
        index: usize,
        /// Options in the whole sweep.
        total: usize,
        /// The option's row.
        row: SweepRow,
    },
    /// The sweep done (its rows, axes and what stayed fixed): the share's rows alone
    /// when the request asked for a share.
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
    /// The traffic report of the requested design's frame model (`traffic_report`).
    Traffic {
        /// The report, `None` when the engine has none, or why there is none.
        outcome: TrafficOutcome,
    },
    /// The stability of the requested design under the dead load (`stability`).
    Stability {
        /// The results, or why there are none.
        outcome: StabilityOutcome,
    },
    /// The size report of the requested design (`sized`).
    Sized {
        /// The report, or why there is none.
        outcome: SizeOutcome,
    },
    /// What the massing loop did, and the design it ends with.
    Massed {
        /// Whether a pass adopted the sections it started from.
        converged: bool,
        /// Passes made.
        passes: usize,
        /// Form thrust of the design the last pass sized, kN.
        form_thrust: f64,
        /// Steel of the last pass's sizes, t.
        steel: f64,
        /// What changed last (when not converged: why it stopped).
        last_change: String,
        /// The design with the last pass's sizes adopted, as `permalink::to_transfer`
        /// text (not validated: the page checks it as an edit).
        design: String,
    },
    /// The request could not be carried out; the words say why.
    Failed {
        /// Why, for the user.
        message: String,
    },
}

/// The traffic report of a design's frame model, `Ok(None)` when the engine has none, or
/// the engine's error in words.
pub type TrafficOutcome = Result<Option<TrafficReport>, String>;

/// The stability results of a design, or the engine's error in words.
pub type StabilityOutcome = Result<ArchStability, String>;

/// The size report of a design, or the engine's error in words.
pub type SizeOutcome = Result<SizeReport, String>;

/// The traffic envelopes of `valid`'s frame model (`arch::traffic::traffic_envelopes`),
/// the engine's error in words.
pub fn traffic_report(valid: &Result<ValidDesign, String>) -> TrafficOutcome {
    let valid = valid.as_ref().map_err(Clone::clone)?;
    traffic_envelopes(valid, ModelKind::Frame).map_err(|e| e.to_string())
}

/// The dead load's buckling and the natural frequencies of `valid`, `modes` of each kind
/// (`arch::stability::arch_stability`), the engine's error in words.
pub fn stability(valid: &Result<ValidDesign, String>, modes: usize) -> StabilityOutcome {
    let valid = valid.as_ref().map_err(Clone::clone)?;
    arch_stability(valid, modes).map_err(|e| e.to_string())
}

/// The size report of `valid` from its frame model's traffic report `traffic`
/// (`arch::sizing::size_design`), or why there is none, in words.
pub fn sized(valid: &Result<ValidDesign, String>, traffic: &TrafficOutcome) -> SizeOutcome {
    let valid = valid.as_ref().map_err(Clone::clone)?;
    match traffic {
        Ok(Some(report)) => size_design(valid, report).map_err(|e| e.to_string()),
        Ok(None) => Err("the frame model has no traffic envelopes to size with".into()),
        Err(e) => Err(e.clone()),
    }
}

/// `design` checked once for all of the settled results.
pub fn validated(design: &Design) -> Result<ValidDesign, String> {
    ValidDesign::new(design).map_err(|e| e.to_string())
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
        Request::Sweep { link, axes, size, share } => {
            let design = match permalink::decode(&link) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            let swept = sweep_share(&design, &axes, size, share, |index, total, row| {
                post(Reply::Row { index, total, row: row.clone() });
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
        Request::Settled { design, modes, size } => {
            let design = match permalink::from_transfer(&design) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            let valid = validated(&design);
            // each posted as soon as it is found: the page shows the traffic report first
            let traffic = traffic_report(&valid);
            post(Reply::Traffic { outcome: traffic.clone() });
            post(Reply::Stability { outcome: stability(&valid, modes) });
            if size {
                post(Reply::Sized { outcome: sized(&valid, &traffic) });
            }
        }
        Request::Massing { design, passes } => {
            let design = match permalink::from_transfer(&design) {
                Ok(design) => design,
                Err(e) => return post(Reply::Failed { message: format!("cannot read the design: {e}") }),
            };
            match massing_loop(&design, passes) {
                Ok(m) => post(Reply::Massed {
                    converged: m.converged,
                    passes: m.passes,
                    form_thrust: m.history.last().map_or(0.0, |h| h.form_thrust),
                    steel: m.report.quantities.steel,
                    last_change: m.last_change,
                    design: permalink::to_transfer(&m.design),
                }),
                Err(e) => post(Reply::Failed { message: e.to_string() }),
            }
        }
    }
}

/// Carries out a request given as JSON text and gives each reply as its bytes
/// ([`reply_bytes`]: what the worker posts). A text that is not a request gives one
/// `Failed` reply.
pub fn run_text(request: &str, post: &mut dyn FnMut(Vec<u8>)) {
    let mut send = |reply: Reply| post(reply_bytes(&reply));
    match serde_json::from_str::<Request>(request) {
        Ok(request) => run(request, &mut send),
        Err(e) => send(Reply::Failed {
            message: format!("the page sent the worker a request it cannot read ({e})"),
        }),
    }
}

/// What the page says of bytes from the worker that are not one whole reply.
pub const UNREADABLE_REPLY: &str = "the background worker sent a reply the page cannot read; reload the page";

/// The fingerprint of this build's replies (`build.rs`: a hash of the worker's and the
/// engine's sources): the first bytes of every reply.
pub const WIRE: &str = env!("SPRINGLINE_WIRE");

/// A reply as the bytes the worker posts: [`WIRE`], then the reply in postcard (enums
/// that JSON tags internally are tagged externally here,
/// `springline_statics::json::tagged_in_json`).
pub fn reply_bytes(reply: &Reply) -> Vec<u8> {
    let start = || WIRE.as_bytes().to_vec();
    // writing into a growable vector fails only for a sequence of unknown length, which
    // no reply has; should one, the page hears why
    postcard::to_extend(reply, start()).unwrap_or_else(|e| {
        let failed =
            Reply::Failed { message: format!("the background worker could not write its reply ({e})") };
        postcard::to_extend(&failed, start()).unwrap_or_default()
    })
}

/// A reply from the bytes the worker posted.
///
/// Errors, in words for the page: bytes of another build's worker (a worker cached from
/// before an update: postcard would misread them, so they are refused), or bytes that
/// are not one whole reply.
pub fn read_reply(bytes: &[u8]) -> Result<Reply, String> {
    let Some(body) = bytes.strip_prefix(WIRE.as_bytes()) else {
        return Err("the page's background worker is from another version of Springline (the browser kept \
                    an old copy); reload the page"
            .into());
    };
    match postcard::take_from_bytes::<Reply>(body) {
        Ok((reply, [])) => Ok(reply),
        _ => Err(UNREADABLE_REPLY.into()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::arch::sweep::{parse_axis, sweep};
    use springline_statics::Design;

    fn replies(request: &Request) -> Vec<Reply> {
        let mut out = Vec::new();
        run_text(&serde_json::to_string(request).expect("json"), &mut |bytes| {
            out.push(read_reply(&bytes).expect("a reply"))
        });
        out
    }

    #[test]
    fn a_sweep_posts_every_row_then_the_same_sweep_the_engine_makes() {
        let design = Design::demo();
        let axes = vec![parse_axis("rise-ratio=0.12:0.2:3").expect("axis")];
        let link = permalink::encode(&design);
        let out = replies(&Request::Sweep {
            link: link.clone(),
            axes: axes.clone(),
            size: false,
            share: Share::WHOLE,
        });
        assert_eq!(out.len(), 4);
        let expected = sweep(&design, &axes, false).expect("sweeps");
        for (k, reply) in out[..3].iter().enumerate() {
            assert_eq!(*reply, Reply::Row { index: k, total: 3, row: expected.rows[k].clone() });
        }
        assert_eq!(out[3], Reply::Swept { sweep: expected.clone() });
        // the second of two shares: the middle option alone, at its place in the whole
        let share = Share { part: 1, parts: 2 };
        let out = replies(&Request::Sweep { link, axes, size: false, share });
        assert_eq!(out[0], Reply::Row { index: 1, total: 3, row: expected.rows[1].clone() });
        assert!(matches!(&out[1], Reply::Swept { sweep } if sweep.rows == expected.rows[1..2]), "{out:?}");
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

    /// The settled results are the engine's own, bit for bit after the trip as bytes
    /// (traffic first: the envelope waits for it; the size report only when asked); a
    /// design the engine refuses gives its reason in each.
    #[test]
    fn settled_results_are_the_engines_traffic_report_then_its_stability() {
        let mut design = Design::demo();
        design.panels = 12;
        let out =
            replies(&Request::Settled { design: permalink::to_transfer(&design), modes: 3, size: true });
        let valid = ValidDesign::new(&design).expect("valid");
        let report = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame report");
        let stability = arch_stability(&valid, 3).expect("stability");
        let mut sizes = size_design(&valid, &report).expect("sizes");
        assert!(!report.lines.is_empty() && stability.vibration.modes.len() == 3);
        // the rib's buckling cases keep each member's axial force for the sizing's own
        // use; it does not travel (`#[serde(skip)]`)
        let cases = &mut sizes.sizing.rib_stability.as_mut().expect("a steel rib's buckling").cases;
        assert!(cases.iter().all(|c| !c.member_axial.is_empty()));
        cases.iter_mut().for_each(|c| c.member_axial.clear());
        assert!(sizes.quantities.steel > 0.0);
        assert_eq!(
            out,
            vec![
                Reply::Traffic { outcome: Ok(Some(report)) },
                Reply::Stability { outcome: Ok(stability) },
                Reply::Sized { outcome: Ok(sizes) }
            ]
        );
        // a crown below the springings: refused with the validation's words, in both
        design.springing_left_level = 1.0e4;
        let reason = ValidDesign::new(&design).expect_err("refused").to_string();
        let out =
            replies(&Request::Settled { design: permalink::to_transfer(&design), modes: 3, size: false });
        assert_eq!(
            out,
            vec![Reply::Traffic { outcome: Err(reason.clone()) }, Reply::Stability { outcome: Err(reason) }]
        );
        let bad = replies(&Request::Settled { design: "not a design".into(), modes: 3, size: true });
        assert!(
            matches!(&bad[..], [Reply::Failed { message }] if message.starts_with("cannot read the design"))
        );
        // "nothing buckles it" is infinite, and it comes back so
        let mut unbounded = stability_of_demo();
        unbounded.arch.alpha_cr = f64::INFINITY;
        unbounded.alpha_cr = f64::INFINITY;
        let bytes = reply_bytes(&Reply::Stability { outcome: Ok(unbounded.clone()) });
        assert_eq!(read_reply(&bytes), Ok(Reply::Stability { outcome: Ok(unbounded) }));
        // cut short or with bytes left over: no reply
        assert!(read_reply(&bytes[..bytes.len() - 1]).is_err_and(|e| e.contains("cannot read")));
        assert!(read_reply(&[bytes.as_slice(), &[0]].concat()).is_err_and(|e| e.contains("cannot read")));
        // another build's worker: refused, whatever follows
        let mut other = bytes.clone();
        other[0] = if other[0] == b'0' { b'1' } else { b'0' };
        assert!(read_reply(&other).is_err_and(|e| e.contains("another version")));
        assert_eq!(WIRE.len(), 16);
        assert!(bytes.starts_with(WIRE.as_bytes()));
    }

    fn stability_of_demo() -> ArchStability {
        arch_stability(&ValidDesign::new(&Design::demo()).expect("valid"), 3).expect("stability")
    }

    /// Every kind of design the engine reports on comes back whole: each report read back
    /// from its bytes equals the engine's (each rib system and load-model family reaches
    /// different variants of the enums JSON tags internally, which travel tagged
    /// externally).
    #[test]
    fn settled_results_travel_for_every_rib_system_and_load_model() {
        use springline_statics::arch::design::RibSystem;
        use springline_statics::traffic::models::ModelFamily;
        use springline_statics::traffic::TrafficDesign;
        let mut designs = Vec::new();
        for (system, family, panels) in [
            (RibSystem::ThreeHinged, ModelFamily::EnLm1, 8),
            (RibSystem::TwoHinged, ModelFamily::Hl93, 10),
            (RibSystem::Fixed, ModelFamily::Crowd, 16),
            (RibSystem::TwoHinged, ModelFamily::UserDefined, 24),
        ] {
            let mut d = Design::demo();
            d.rib_system = system;
            d.panels = panels;
            d.traffic = TrafficDesign::preset(family, d.traffic.carriageway_width);
            designs.push((format!("{system:?} {family:?}"), d));
        }
        for (what, design) in designs {
            let out =
                replies(&Request::Settled { design: permalink::to_transfer(&design), modes: 3, size: true });
            let valid = ValidDesign::new(&design).expect("valid");
            let report = traffic_envelopes(&valid, ModelKind::Frame).expect("solves");
            let mut sizes = size_design(&valid, report.as_ref().expect("frame report")).expect("sizes");
            assert_eq!(out[0], Reply::Traffic { outcome: Ok(report) }, "{what}");
            assert_eq!(
                out[1],
                Reply::Stability { outcome: arch_stability(&valid, 3).map_err(|e| e.to_string()) },
                "{what}"
            );
            // the rib's per-member axial forces stay behind (`#[serde(skip)]`)
            if let Some(rib) = sizes.sizing.rib_stability.as_mut() {
                rib.cases.iter_mut().for_each(|c| c.member_axial.clear());
            }
            assert!(sizes.quantities.steel > 0.0, "{what}");
            assert_eq!(out[2], Reply::Sized { outcome: Ok(sizes) }, "{what}");
        }
    }

    /// The massing loop's outcome and design are the engine's; a design the engine
    /// refuses gives its reason.
    #[test]
    fn the_massing_loop_posts_the_engines_outcome_and_design() {
        let mut design = Design::demo();
        design.panels = 10;
        let out = replies(&Request::Massing { design: permalink::to_transfer(&design), passes: 6 });
        let m = massing_loop(&design, 6).expect("loops");
        let [Reply::Massed { converged, passes, form_thrust, steel, last_change, design: text }] = &out[..]
        else {
            panic!("{out:?}")
        };
        assert_eq!((*converged, *passes, last_change), (m.converged, m.passes, &m.last_change));
        assert_eq!(*form_thrust, m.history.last().expect("a pass").form_thrust);
        assert_eq!(*steel, m.report.quantities.steel);
        assert!(*steel > 0.0 && *form_thrust > 0.0);
        assert_eq!(permalink::from_transfer(text), Ok(m.design));
        design.springing_left_level = 1.0e4;
        let reason = massing_loop(&design, 6).expect_err("refused").to_string();
        let out = replies(&Request::Massing { design: permalink::to_transfer(&design), passes: 6 });
        assert_eq!(out, vec![Reply::Failed { message: reason }]);
    }

    #[test]
    fn bad_requests_are_failures_not_panics() {
        let mut out = Vec::new();
        run_text("{\"Sweep\": 3}", &mut |bytes| out.push(read_reply(&bytes)));
        assert!(
            matches!(&out[..], [Ok(Reply::Failed { message })] if message.contains("cannot read")),
            "{out:?}"
        );
        let bad = replies(&Request::Sweep {
            link: "nonsense".into(),
            axes: vec![],
            size: false,
            share: Share::WHOLE,
        });
        assert!(
            matches!(&bad[0], Reply::Failed { message } if message.starts_with("cannot read the design"))
        );
        let demo = permalink::encode(&Design::demo());
        let no_axis =
            replies(&Request::Sweep { link: demo.clone(), axes: vec![], size: false, share: Share::WHOLE });
        assert!(matches!(&no_axis[0], Reply::Failed { message } if message.contains("varies one parameter")));
        let axes = vec![parse_axis("rise-ratio=0.12:0.2:3").expect("axis")];
        let no_share =
            replies(&Request::Sweep { link: demo, axes, size: false, share: Share { part: 3, parts: 2 } });
        assert!(
            matches!(&no_share[0], Reply::Failed { message } if message.contains("share 3 of 2")),
            "{no_share:?}"
        );
    }
}
