// Benchmarks live here (see docs/performance.md); filled in by the scale work.
System.Console.WriteLine("no benchmarks yet");
