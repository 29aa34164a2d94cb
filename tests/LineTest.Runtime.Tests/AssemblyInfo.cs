// Serial-port and database tests share machine resources; collections run in parallel by default.
[assembly: CollectionBehavior(MaxParallelThreads = 2)]
