// Database tests share one server and two cores; collections run in parallel by default.
[assembly: CollectionBehavior(MaxParallelThreads = 2)]
