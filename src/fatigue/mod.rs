//! Fatigue of riveted members and eyebars: the live-load stress history of
//! each member as the fatigue vehicle crosses the deck (`history`), counted
//! by rainflow (`rainflow`), and evaluated by AASHTO MBE Section 7 (`mbe`)
//! and EN 1993-1-9 (`en1993_1_9`). SI throughout, no I/O.

pub mod en1993_1_9;
pub mod mbe;
pub mod rainflow;
