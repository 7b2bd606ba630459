//! Why a command failed, and the exit code that says so.
//!
//! Usage errors (exit 2) never reach this type: clap reports them and exits before a
//! command runs. Everything else a command can meet is sorted here, explicitly, into
//! "the engine refused the input" (exit 1) or "a file could not be read or written"
//! (exit 3), so a script can tell a bad design from a missing file.

use springline_statics::StaticsError;
use std::fmt;
use std::process::ExitCode;

/// Exit code of a command that ran to the end.
pub const EXIT_SUCCESS: u8 = 0;
/// Exit code when the engine refused the input: an invalid design or model, a
/// mechanism, an unreadable link, or file content that is not a design or model.
pub const EXIT_REFUSED: u8 = 1;
/// Exit code of a usage error (unknown command, missing or conflicting arguments).
/// clap uses it for every error it reports; named here so the help and tests agree.
pub const EXIT_USAGE: u8 = 2;
/// Exit code when a file, standard input or standard output could not be read or
/// written.
pub const EXIT_IO: u8 = 3;

/// A command that did not succeed, with its message (and the chain of causes).
#[derive(Debug)]
pub enum Failure {
    /// The engine refused the input, or the content read is not what the command
    /// needs (exit 1).
    Refused(anyhow::Error),
    /// A file or stream could not be read or written (exit 3).
    Io(anyhow::Error),
}

impl Failure {
    /// The input was refused, for the reason given.
    pub fn refused(message: impl fmt::Display + fmt::Debug + Send + Sync + 'static) -> Self {
        Failure::Refused(anyhow::Error::msg(message))
    }

    /// The process exit code of this failure.
    pub fn exit_code(&self) -> ExitCode {
        ExitCode::from(match self {
            Failure::Refused(_) => EXIT_REFUSED,
            Failure::Io(_) => EXIT_IO,
        })
    }
}

/// The message with every cause, joined by ": " (the engine's reason last).
impl fmt::Display for Failure {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Failure::Refused(e) | Failure::Io(e) => write!(f, "{e:#}"),
        }
    }
}

/// Every engine error is a refusal of the input: the engine does no IO.
impl From<StaticsError> for Failure {
    fn from(e: StaticsError) -> Self {
        Failure::Refused(e.into())
    }
}
