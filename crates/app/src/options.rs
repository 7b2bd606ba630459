//! Design options: the list saved in this browser (local storage, each option as its
//! design link, `link::comparison::write_saved`), a comparison opened from a meeting link
//! (shown instead of the saved list until the user adds it or goes back), and each
//! option's key numbers, worked out in the background worker (each option is sized, which
//! takes longer than a redraw) and kept by design link.
//!
//! Stored content that cannot be read (damaged, or written by another version) is never
//! deleted: it is copied under a key of its own (`springline.options.set-aside.N`) and the
//! page says so; single options whose link no longer opens are set aside the same way
//! and the others kept.

use crate::worker_job::{finish, Job};
use leptos::prelude::*;
use springline_statics::arch::options::{KeyNumbers, MAX_COMPARED};
use springline_statics::link::comparison::{
    encode_comparison, read_saved, tidy_name, write_saved, Comparison, NamedDesign, SetAside,
};
use springline_statics::link::permalink;
use springline_statics::Design;
use springline_worker::{Reply, Request};
use std::collections::HashMap;

/// The storage key of the saved options.
pub const OPTIONS_KEY: &str = "springline.options";
/// The start of the keys under which unreadable stored options are kept.
pub const SET_ASIDE_PREFIX: &str = "springline.options.set-aside.";

/// The options on the page.
#[derive(Clone, Copy)]
pub struct OptionsState {
    /// Options saved in this browser, in order.
    pub saved: RwSignal<Vec<NamedDesign>>,
    /// A comparison opened from a link (shown instead of the saved options).
    pub shared: RwSignal<Option<Comparison>>,
    /// Key numbers by design link, as the worker finds them.
    pub numbers: RwSignal<HashMap<String, KeyNumbers>>,
    /// What the options panel has to say (set-aside content, a full list, a failure).
    pub message: RwSignal<Option<String>>,
    /// The job working out key numbers (dropping it ends its worker).
    job: StoredValue<Option<Job>, LocalStorage>,
    /// Whether the list may be written to storage (not when unreadable content could not
    /// be copied aside: writing would lose it).
    writable: StoredValue<bool>,
}

impl OptionsState {
    /// The state with the saved options read from storage (a message when some were set
    /// aside) and the comparison a link opened, if any; installs the storage sync and the
    /// key-numbers job.
    pub fn install(shared: Option<Comparison>) -> OptionsState {
        let (saved, message, writable) = load_saved();
        let options = OptionsState {
            saved: RwSignal::new(saved),
            shared: RwSignal::new(shared),
            numbers: RwSignal::new(HashMap::new()),
            message: RwSignal::new(message),
            job: StoredValue::new_local(None),
            writable: StoredValue::new(writable),
        };
        // the list follows into storage (after anything unreadable was set aside)
        Effect::new(move |_| {
            let text = options.saved.with(|s| write_saved(s));
            if !options.writable.get_value() {
                return;
            }
            if let Some(storage) = storage() {
                if storage.set_item(OPTIONS_KEY, &text).is_err() {
                    options.message.set(Some(
                        "This browser did not keep the options (its storage is full or blocked); they last until \
                         the page is closed."
                            .into(),
                    ));
                }
            }
        });
        // key numbers of the options shown, in the worker
        Effect::new(move |_| {
            let links: Vec<String> = options.shown().iter().map(|o| permalink::encode(&o.design)).collect();
            let missing: Vec<String> = options
                .numbers
                .with_untracked(|n| links.into_iter().filter(|l| !n.contains_key(l)).collect());
            if missing.is_empty() {
                return;
            }
            let asked = missing.clone();
            let job = Job::start(&Request::KeyNumbers { links: missing }, move |reply| match reply {
                Reply::Numbers { index, numbers } => {
                    if let Some(link) = asked.get(index) {
                        options.numbers.update(|n| {
                            n.insert(link.clone(), numbers);
                        });
                    }
                    // the last answer ends the job; its worker waits for the next
                    if index + 1 == asked.len() {
                        finish(options.job);
                    }
                }
                Reply::Failed { message } => {
                    // every option still waiting shows why, instead of waiting for ever
                    let reason = format!(
                        "its numbers could not be worked out: {message}; reload the page to try again"
                    );
                    options.numbers.update(|n| {
                        for link in &asked {
                            n.entry(link.clone()).or_insert_with(|| KeyNumbers {
                                reason: Some(reason.clone()),
                                ..KeyNumbers::default()
                            });
                        }
                    });
                    options.job.set_value(None);
                }
                _ => {}
            });
            match job {
                Ok(job) => options.job.set_value(Some(job)),
                Err(e) => options.message.set(Some(format!("The key numbers cannot be worked out: {e}"))),
            }
        });
        options
    }

    /// The options the comparison shows: the link's, else the saved ones.
    pub fn shown(&self) -> Vec<NamedDesign> {
        self.shared.with(|s| s.as_ref().map(|c| c.options.clone())).unwrap_or_else(|| self.saved.get())
    }

    /// Saves `design` as an option named `name` (tidied). Refused with words when the list
    /// is full.
    pub fn save(&self, name: &str, design: &Design) -> Result<String, String> {
        let name = tidy_name(name);
        if self.saved.with_untracked(Vec::len) >= MAX_COMPARED {
            return Err(format!(
                "Four options are saved, as many as the comparison shows; remove one to save '{name}'."
            ));
        }
        self.saved.update(|s| s.push(NamedDesign { name: name.clone(), design: design.clone() }));
        Ok(name)
    }

    /// Adds the options of the comparison a link opened to the saved ones (as many as
    /// there is room for) and shows the saved list.
    pub fn adopt_shared(&self) {
        let Some(shared) = self.shared.get_untracked() else { return };
        let room = MAX_COMPARED.saturating_sub(self.saved.with_untracked(Vec::len));
        let left_out = shared.options.len().saturating_sub(room);
        self.saved.update(|s| s.extend(shared.options.into_iter().take(room)));
        self.shared.set(None);
        if left_out > 0 {
            self.message.set(Some(format!(
                "{} of the link's options did not fit (four options at most); remove some of yours and open \
                 the link again to add them.",
                springline_statics::error::counted(left_out, "option", "options")
            )));
        }
    }

    /// The meeting link's payload (`o1.xxxx`) for the options shown, opening the one on
    /// screen (or the first).
    pub fn comparison_payload(&self, open_design: &Design) -> Option<String> {
        let options = self.shown();
        let open = options.iter().position(|o| o.design == *open_design).unwrap_or(0);
        encode_comparison(&Comparison { options, open }).ok()
    }
}

fn storage() -> Option<web_sys::Storage> {
    web_sys::window()?.local_storage().ok()?
}

/// The saved options, a message when some (or all) stored content was set aside, and
/// whether the list may be written back (not when the content could not be copied aside).
fn load_saved() -> (Vec<NamedDesign>, Option<String>, bool) {
    let Some(storage) = storage() else { return (Vec::new(), None, true) };
    let Ok(Some(text)) = storage.get_item(OPTIONS_KEY) else { return (Vec::new(), None, true) };
    let kept_in_place = |why: String| {
        (
            Vec::new(),
            Some(format!(
                "{why} They could not be copied aside (the browser's storage is full or blocked), so they are left \
                 where they are and options saved now last only until the page is closed."
            )),
            false,
        )
    };
    match read_saved(&text) {
        Ok(read) if read.set_aside.is_empty() => (read.options, None, true),
        Ok(read) => {
            let names: Vec<String> =
                read.set_aside.iter().map(|s| format!("'{}' ({})", s.name, s.reason)).collect();
            let count =
                springline_statics::error::counted(read.set_aside.len(), "saved option", "saved options");
            let Some(key) = set_aside(&storage, &set_aside_text(&read.set_aside)) else {
                return kept_in_place(format!("{count} could not be opened: {}.", names.join("; ")));
            };
            (
                read.options,
                Some(format!(
                    "{count} could not be opened and {} set aside, kept in this browser's storage under '{key}': {}.",
                    if read.set_aside.len() == 1 { "is" } else { "are" },
                    names.join("; ")
                )),
                true,
            )
        }
        Err(e) => {
            let Some(key) = set_aside(&storage, &text) else {
                return kept_in_place(format!("The saved options could not be read ({e})."));
            };
            (
                Vec::new(),
                Some(format!(
                    "The saved options could not be read ({e}). They are kept, untouched, in this browser's storage \
                     under '{key}'; the list starts empty."
                )),
                true,
            )
        }
    }
}

/// The set-aside options as stored content of their own (name and link each).
fn set_aside_text(entries: &[SetAside]) -> String {
    let list: Vec<serde_json::Value> = entries
        .iter()
        .map(|e| serde_json::json!({ "name": e.name, "link": e.link, "reason": e.reason }))
        .collect();
    serde_json::Value::Array(list).to_string()
}

/// Keeps `text` under the first free set-aside key and returns the key; `None` when the
/// storage refuses it (full or blocked) or a thousand keys are taken.
fn set_aside(storage: &web_sys::Storage, text: &str) -> Option<String> {
    for n in 1..=1000u32 {
        let key = format!("{SET_ASIDE_PREFIX}{n}");
        if let Ok(None) = storage.get_item(&key) {
            return storage.set_item(&key, text).ok().map(|()| key);
        }
    }
    None
}
