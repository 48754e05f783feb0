pub mod gusset;
